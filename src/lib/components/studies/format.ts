export { formatAmount, formatDateTime } from '../recipes/format';

export function formatCells(value: number | null | undefined): string {
	if (value === null || value === undefined || !Number.isFinite(value)) return '—';
	return value.toExponential(2).replace('e+', ' × 10^');
}

export function formatPercent(fraction: number): string {
	return `${(fraction * 100).toFixed(0)} %`;
}

/** Why a nutrient line has no run-out time, in the table's words. */
const NO_RUNOUT_WORDS = {
	modelled: 'see S in the time course',
	lasts: 'lasts the run',
	'no time course': 'no time course'
} as const;

/**
 * "16 h", "from the start", or "16 h (to 24 h)" when a feed covers the nutrient again. Without a
 * run-out, why (`noRunout`: the carbon source is modelled, the nutrient lasts, no time course); "—"
 * only when that is not known.
 */
export function formatRunout(
	runout: { shortFromH: number; coveredAgainH: number | null } | null,
	noRunout: keyof typeof NO_RUNOUT_WORDS | null = null
): string {
	if (runout === null) return noRunout ? NO_RUNOUT_WORDS[noRunout] : '—';
	const from = runout.shortFromH <= 0 ? 'from the start' : `${runout.shortFromH.toFixed(0)} h`;
	return runout.coveredAgainH === null ? from : `${from} (to ${runout.coveredAgainH.toFixed(0)} h)`;
}

/** Each distinct source of a report's nutrient values once, in table order (screen and PDF list them alike). */
export function listValueSources(lines: readonly { source?: string | null }[]): string[] {
	return [...new Set(lines.flatMap((l) => (l.source ? [l.source] : [])))];
}
