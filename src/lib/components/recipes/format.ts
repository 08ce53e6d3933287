/** Three significant figures, without trailing zeros or exponent for everyday sizes. */
export function formatAmount(value: number | null | undefined): string {
	if (value === null || value === undefined || !Number.isFinite(value)) return '—';
	if (value === 0) return '0';
	const abs = Math.abs(value);
	if (abs >= 1e5 || abs < 1e-4) return value.toExponential(2);
	return Number(value.toPrecision(3)).toString();
}

export function formatDateTime(value: Date | string | number | null | undefined): string {
	if (!value) return '—';
	return `${new Date(value).toISOString().replace('T', ' ').slice(0, 16)} UTC`;
}
