import type { DraftFieldsInput, DraftLineInput } from '$lib/recipes';

/** What the other person saved, sent back with a refused save from an older revision. */
export interface DraftConflict {
	revision: number;
	byName: string | null;
	at: string;
	fields: DraftFieldsInput;
	lines: DraftLineInput[];
	names: string[];
}

/** Error paths of the preview name the lines sent; turn them back into the editor's indexes. */
export function remapPreviewErrors(
	errors: { path: string; message: string }[],
	sent: number[]
): Record<string, string[]> {
	const out: Record<string, string[]> = {};
	for (const { path, message } of errors) {
		const key = path.replace(/^lines\.(\d+)/, (_m, k: string) => `lines.${sent[Number(k)] ?? k}`);
		// Shown beside its line, so the server's line number (of the lines sent) is left off.
		(out[key] ??= []).push(message.replace(/^Line \d+: /, ''));
	}
	return out;
}
