/** Reads a number as people type it; a decimal comma is accepted, anything else is refused. */
export function readNumberText(text: string): number | null {
	const cleaned = text.trim().replace(/^([+-]?\d*),(\d+)$/, '$1.$2');
	if (cleaned === '' || !/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(cleaned)) return null;
	return Number(cleaned);
}
