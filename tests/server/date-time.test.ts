// One way to show a moment: ISO 8601 date, 24-hour time and the zone, in the site's time zone.
// Check values from the EU summer-time rule (Directive 2000/84/EC: from 01:00 UTC on the last Sunday
// of March to 01:00 UTC on the last Sunday of October) and US Central time (UTC−6, UTC−5 in summer
// from the second Sunday of March, Energy Policy Act of 2005).
import { describe, expect, it } from 'vitest';
import { formatDateTime, formatDay, formatTimeOfDay, isTimeZone } from '$lib/date-time';

describe('dates and times as pages show them', () => {
	it('writes the date, the 24-hour time and the zone, across a summer-time change', () => {
		// 2026-03-29 is the last Sunday of March: Berlin goes from CET (UTC+1) to CEST (UTC+2) at 01:00 UTC.
		expect(formatDateTime('2026-03-29T00:59:00Z', 'Europe/Berlin')).toBe('2026-03-29 01:59 CET');
		expect(formatDateTime('2026-03-29T01:00:00Z', 'Europe/Berlin')).toBe('2026-03-29 03:00 CEST');
		expect(formatDateTime('2026-12-03T14:05:09Z', 'UTC')).toBe('2026-12-03 14:05 UTC');
		expect(formatTimeOfDay('2026-12-03T14:05:09Z', 'UTC')).toBe('14:05:09 UTC');
		expect(formatTimeOfDay('2026-03-29T01:00:00Z', 'Europe/Berlin')).toBe('03:00:00 CEST');
	});

	it('gives the day in the site’s zone, which may differ from the UTC day', () => {
		// 03:30 UTC on 3 December is 21:30 on 2 December in Chicago (CST, UTC−6).
		expect(formatDay('2026-12-03T03:30:00Z', 'America/Chicago')).toBe('2026-12-02');
		// A zone without a British short name is written by its offset, which no reader can mistake.
		expect(formatDateTime('2026-12-03T03:30:00Z', 'America/Chicago')).toBe(
			'2026-12-02 21:30 GMT-6'
		);
		// Midnight is 00, never 24.
		expect(formatDateTime('2026-12-03T00:00:00Z', 'UTC')).toBe('2026-12-03 00:00 UTC');
	});

	it('knows a time zone name from one it does not', () => {
		expect(isTimeZone('Europe/Berlin')).toBe(true);
		expect(isTimeZone('UTC')).toBe(true);
		expect(isTimeZone('Mars/Olympus_Mons')).toBe(false);
		expect(isTimeZone('')).toBe(false);
	});
});
