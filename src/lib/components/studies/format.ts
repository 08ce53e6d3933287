export { formatAmount, formatDateTime } from '../recipes/format';

export function formatCells(value: number | null | undefined): string {
	if (value === null || value === undefined || !Number.isFinite(value)) return '—';
	return value.toExponential(2).replace('e+', ' × 10^');
}

export function formatPercent(fraction: number): string {
	return `${(fraction * 100).toFixed(0)} %`;
}
