// The model help is written in a small subset of Markdown (## headings, - lists, **bold**); it is
// turned into plain elements rather than HTML so nothing in it can ever be markup.
export type TextRun = { text: string; strong: boolean };
export type HelpBlock =
	| { kind: 'heading'; text: string }
	| { kind: 'paragraph'; runs: TextRun[] }
	| { kind: 'list'; items: TextRun[][] };

function splitRuns(text: string): TextRun[] {
	return text
		.split(/\*\*/)
		.map((part, i) => ({ text: part, strong: i % 2 === 1 }))
		.filter((run) => run.text !== '');
}

export function parseHelpText(source: string): HelpBlock[] {
	const blocks: HelpBlock[] = [];
	for (const chunk of source.split(/\n\s*\n/)) {
		const lines = chunk.split('\n');
		if (lines[0].startsWith('## ')) {
			blocks.push({ kind: 'heading', text: lines[0].slice(3).trim() });
			lines.shift();
			if (!lines.length) continue;
		}
		const joined = lines.join('\n').trim();
		if (!joined) continue;
		if (joined.includes('\n- ') || joined.startsWith('- ')) {
			const [lead, ...items] = joined.split(/(?:^|\n)- /);
			if (lead.trim())
				blocks.push({ kind: 'paragraph', runs: splitRuns(lead.replace(/\s+/g, ' ').trim()) });
			blocks.push({
				kind: 'list',
				items: items.map((item) => splitRuns(item.replace(/\s+/g, ' ').trim()))
			});
		} else {
			blocks.push({ kind: 'paragraph', runs: splitRuns(joined.replace(/\s+/g, ' ')) });
		}
	}
	return blocks;
}
