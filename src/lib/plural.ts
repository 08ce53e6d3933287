/** "1 lot", "3 lots", "2 batches": a count with its noun, one rule for every message. */
export function countOf(n: number, one: string, many = `${one}s`): string {
	return `${n.toLocaleString('en')} ${n === 1 ? one : many}`;
}
