import { readDecimalText } from '$lib/quantities';
/** A typed number by the one rule of `readDecimalText`, or null when it is not one. */
export function readNumberText(text: string): number | null {
	const read = readDecimalText(text, 'Number');
	return read.ok ? read.value : null;
}
