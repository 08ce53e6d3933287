// The absolute limit of a session: however busy, a session ends this many days after sign-in. A
// site setting; a working week (7 days) is common practice for internal tools.
import { readDecimalText } from '$lib/number-reading';
import type { Actor } from '../audit';
import { db, type Db } from '../db';
import { RuleError } from '../rule-error';
import { settingText, storeSetting } from '../site-settings';

type Reader = Pick<Db, 'select'>;

export const SESSION_ABSOLUTE_DAYS_KEY = 'session.absolute_days';
export const DEFAULT_SESSION_ABSOLUTE_DAYS = 7;
export const SESSION_ABSOLUTE_RANGE_DAYS = { min: 1, max: 90 } as const;
export const SESSION_ABSOLUTE_DAYS_LABEL = 'Longest session (days)';

/** The stored days, or the default when unset or unreadable. */
function absoluteDaysOf(stored: string | undefined): number {
	const value = stored === undefined ? NaN : Number(stored);
	return Number.isInteger(value) && value > 0 ? value : DEFAULT_SESSION_ABSOLUTE_DAYS;
}

export function sessionAbsoluteDays(reader: Reader = db): number {
	return absoluteDaysOf(settingText(SESSION_ABSOLUTE_DAYS_KEY, reader));
}

export function setSessionAbsoluteDays(actor: Actor, text: string): void {
	const trimmed = text.trim();
	const read = readDecimalText(trimmed, SESSION_ABSOLUTE_DAYS_LABEL);
	if (!read.ok) throw new RuleError(read.message, { field: 'sessionAbsoluteDays' });
	const value = read.value;
	const { min, max } = SESSION_ABSOLUTE_RANGE_DAYS;
	if (!Number.isInteger(value) || value < min || value > max)
		throw new RuleError(
			`${SESSION_ABSOLUTE_DAYS_LABEL} must be a whole number from ${min} to ${max} (got “${trimmed}”).`,
			{ field: 'sessionAbsoluteDays' }
		);
	storeSetting(
		actor,
		{
			key: SESSION_ABSOLUTE_DAYS_KEY,
			value: String(value),
			action: 'settings.session_absolute_days'
		},
		absoluteDaysOf
	);
}
