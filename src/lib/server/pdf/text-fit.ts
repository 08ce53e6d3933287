import type { PDFFont } from 'pdf-lib';

/**
 * What to draw for a character the font lacks, tried in order. The one place where a symbol missing
 * from the app's font (Lexend has no Greek, no ≤ ≥ →) or from the standard PDF fonts becomes
 * something a reader still understands.
 */
const ALTERNATIVES: Record<string, string[]> = {
	μ: ['µ', 'u'],
	µ: ['μ', 'u'],
	'≤': ['<='],
	'≥': ['>='],
	'→': ['->'],
	'≈': ['~'],
	'−': ['-'],
	'–': ['-'],
	'—': ['-'],
	'·': ['.'],
	'×': ['x'],
	'±': ['+/-'],
	'°': [' deg'],
	'“': ['"'],
	'”': ['"'],
	'‘': ["'"],
	'’': ["'"]
};

const characterSets = new WeakMap<PDFFont, Set<number>>();

function characterSetOf(font: PDFFont): Set<number> {
	let set = characterSets.get(font);
	if (!set) {
		set = new Set(font.getCharacterSet());
		characterSets.set(font, set);
	}
	return set;
}

/**
 * `text` with every character the font can draw kept, and each other one replaced by its listed
 * alternative, a space for any white space, else its compatibility form (₂ → 2, a thin space → a space, ǒ → o), else '?'.
 */
export function fitTextToFont(font: PDFFont, text: string): string {
	const has = characterSetOf(font);
	const drawable = (s: string) => [...s].every((c) => has.has(c.codePointAt(0)!));
	return [...text]
		.map((c) => {
			if (drawable(c)) return c;
			if (/\s/.test(c)) return ' ';
			const listed = ALTERNATIVES[c]?.find(drawable);
			if (listed) return listed;
			const compatible = c.normalize('NFKD').replace(/\p{M}/gu, '');
			return compatible && drawable(compatible) ? compatible : '?';
		})
		.join('');
}
