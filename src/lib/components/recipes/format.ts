import { page } from '$app/state';
import { formatDateTime as formatInZone } from '$lib/date-time';

/** Three significant figures, without trailing zeros or exponent for everyday sizes. */
export function formatAmount(value: number | null | undefined): string {
	if (value === null || value === undefined || !Number.isFinite(value)) return '—';
	if (value === 0) return '0';
	const abs = Math.abs(value);
	if (abs >= 1e5 || abs < 1e-4) return value.toExponential(2);
	return Number(value.toPrecision(3)).toString();
}

/**
 * A moment in the site's time zone, for text built in a script (table cells, titles); markup uses
 * <DateTime>. Reads the zone from the page's data, so it is called while a page renders.
 */
export function formatDateTime(value: Date | string | number | null | undefined): string {
	if (!value) return '—';
	return formatInZone(value, (page.data.siteTimeZone as string | undefined) ?? 'UTC');
}
