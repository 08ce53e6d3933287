// The absolute limit of a session: however busy, a session ends this many days after sign-in. A
// site setting; a working week (7 days) is common practice for internal tools.
import { eq } from 'drizzle-orm';
import { recordAudit, type Actor } from '../audit';
import { db, type Db } from '../db';
import { siteSetting } from '../db/schema';
import { RuleError } from '../rule-error';

type Reader = Pick<Db, 'select'>;

export const SESSION_ABSOLUTE_DAYS_KEY = 'session.absolute_days';
export const DEFAULT_SESSION_ABSOLUTE_DAYS = 7;
export const SESSION_ABSOLUTE_RANGE_DAYS = { min: 1, max: 90 } as const;
export const SESSION_ABSOLUTE_DAYS_LABEL = 'Longest session (days)';

export function sessionAbsoluteDays(reader: Reader = db): number {
	const stored = reader
		.select()
		.from(siteSetting)
		.where(eq(siteSetting.key, SESSION_ABSOLUTE_DAYS_KEY))
		.get()?.value;
	const value = stored === undefined ? NaN : Number(stored);
	return Number.isInteger(value) && value > 0 ? value : DEFAULT_SESSION_ABSOLUTE_DAYS;
}

export function setSessionAbsoluteDays(actor: Actor, text: string): void {
	const trimmed = text.trim();
	const value = Number(trimmed);
	const { min, max } = SESSION_ABSOLUTE_RANGE_DAYS;
	if (!trimmed || !Number.isInteger(value) || value < min || value > max)
		throw new RuleError(
			`${SESSION_ABSOLUTE_DAYS_LABEL} must be a whole number from ${min} to ${max} (got “${trimmed}”).`,
			{ field: 'sessionAbsoluteDays' }
		);
	db.transaction((tx) => {
		const before = sessionAbsoluteDays(tx);
		tx.insert(siteSetting)
			.values({ key: SESSION_ABSOLUTE_DAYS_KEY, value: String(value) })
			.onConflictDoUpdate({
				target: siteSetting.key,
				set: { value: String(value), updatedAt: new Date() }
			})
			.run();
		recordAudit(
			actor,
			{
				action: 'settings.session_absolute_days',
				subjectType: 'site',
				detail: { from: before, to: value }
			},
			tx
		);
	});
}
