// Dates and times as every page shows them: the ISO 8601 date, the 24-hour time and the zone, in the
// site's time zone (an IANA name, a site setting). One way, so a record read at the bench, on the
// review screen and in an export says the same. Intl does the zone arithmetic (the tz database).

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
	let formatter = formatters.get(timeZone);
	if (!formatter) {
		formatter = new Intl.DateTimeFormat('en-GB', {
			timeZone,
			year: 'numeric',
			month: '2-digit',
			day: '2-digit',
			hour: '2-digit',
			minute: '2-digit',
			second: '2-digit',
			hourCycle: 'h23',
			timeZoneName: 'short'
		});
		formatters.set(timeZone, formatter);
	}
	return formatter;
}

function partsOf(at: Date | string | number, timeZone: string) {
	const parts = Object.fromEntries(
		formatterFor(timeZone)
			.formatToParts(new Date(at))
			.map((p) => [p.type, p.value])
	) as Record<Intl.DateTimeFormatPartTypes, string>;
	return {
		date: `${parts.year}-${parts.month}-${parts.day}`,
		time: `${parts.hour}:${parts.minute}`,
		seconds: parts.second,
		zone: parts.timeZoneName
	};
}

/**
 * "2026-12-03 14:05 CET": the date, the 24-hour time and the zone's short name; with `seconds`,
 * "2026-12-03 14:05:09 CET" (the audit trail).
 */
export function formatDateTime(
	at: Date | string | number,
	timeZone: string,
	options: { seconds?: boolean } = {}
): string {
	const { date, time, seconds, zone } = partsOf(at, timeZone);
	return `${date} ${time}${options.seconds ? `:${seconds}` : ''} ${zone}`;
}

const offsetFormatters = new Map<string, Intl.DateTimeFormat>();

/**
 * "2026-12-03T15:05:09+01:00": ISO 8601 in the site's zone with its offset, for CSV columns a
 * spreadsheet or script reads back to the same moment.
 */
export function formatIsoLocal(at: Date | string | number, timeZone: string): string {
	const { date, time, seconds } = partsOf(at, timeZone);
	let formatter = offsetFormatters.get(timeZone);
	if (!formatter) {
		formatter = new Intl.DateTimeFormat('en-GB', { timeZone, timeZoneName: 'longOffset' });
		offsetFormatters.set(timeZone, formatter);
	}
	const name = formatter.formatToParts(new Date(at)).find((p) => p.type === 'timeZoneName')!.value;
	const offset = name === 'GMT' ? '+00:00' : name.replace('GMT', '');
	return `${date}T${time}:${seconds}${offset}`;
}

/** "14:05:09 CET": the time of day with seconds and zone, for "saved at" notes. */
export function formatTimeOfDay(at: Date | string | number, timeZone: string): string {
	const { time, seconds, zone } = partsOf(at, timeZone);
	return `${time}:${seconds} ${zone}`;
}

/** "2026-12-03": the day in the site's zone. */
export function formatDay(at: Date | string | number, timeZone: string): string {
	return partsOf(at, timeZone).date;
}

/** Whether the runtime knows `name` as an IANA time zone. */
export function isTimeZone(name: string): boolean {
	try {
		new Intl.DateTimeFormat('en-GB', { timeZone: name });
		return name.length > 0;
	} catch {
		return false;
	}
}

/**
 * The moment a wall-clock time "2026-12-03T14:05" in `timeZone` names, or null when it is not a
 * date and time. Intl formats in a zone but does not parse in one (and Temporal is not in Node 20),
 * so the zone's offset is read at a first guess and applied twice, which settles across a DST change.
 */
export function parseLocalDateTime(text: string, timeZone: string): Date | null {
	const match = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2}))?$/.exec(text.trim());
	if (!match) return null;
	const [y, mo, d, h, mi, s] = match.slice(1).map((p) => Number(p ?? 0));
	const wall = Date.UTC(y, mo - 1, d, h, mi, s);
	const check = new Date(wall);
	if (check.getUTCMonth() !== mo - 1 || check.getUTCDate() !== d || h > 23 || mi > 59 || s > 59)
		return null;
	const offsetAt = (ms: number) => {
		const { date, time, seconds } = partsOf(ms, timeZone);
		return Date.parse(`${date}T${time}:${seconds}Z`) - Math.floor(ms / 1000) * 1000;
	};
	let guess = wall - offsetAt(wall);
	guess = wall - offsetAt(guess);
	return new Date(guess);
}
