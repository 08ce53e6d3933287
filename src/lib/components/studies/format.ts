export { formatAmount, formatDateTime } from '../recipes/format';

export function formatCells(value: number | null | undefined): string {
	if (value === null || value === undefined || !Number.isFinite(value)) return '—';
	return value.toExponential(2).replace('e+', ' × 10^');
}

export function formatPercent(fraction: number): string {
	return `${(fraction * 100).toFixed(0)} %`;
}

/** "16 h", or "16 h (to 24 h)" when a feed covers the nutrient again; "—" when it never runs short. */
export function formatRunout(
	runout: { shortFromH: number; coveredAgainH: number | null } | null
): string {
	if (runout === null) return '—';
	const from = `${runout.shortFromH.toFixed(0)} h`;
	return runout.coveredAgainH === null ? from : `${from} (to ${runout.coveredAgainH.toFixed(0)} h)`;
}

/** Each distinct source of a report's nutrient values once, in table order (screen and PDF list them alike). */
export function listValueSources(lines: readonly { source?: string | null }[]): string[] {
	return [...new Set(lines.flatMap((l) => (l.source ? [l.source] : [])))];
}
