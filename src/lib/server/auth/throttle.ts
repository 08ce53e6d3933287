import { and, asc, desc, eq, gte } from 'drizzle-orm';
import { db } from '../db';
import { signInAttempt } from '../db/schema';

/**
 * Password tries (sign-in and signatures share the count of a person). A try is counted as a
 * failure before its password is checked, in the same transaction that decides whether it may go
 * on, so concurrent tries cannot slip past the limit; a right password then marks it succeeded.
 */
export const THROTTLE = {
	windowMs: 15 * 60 * 1000,
	/** For one account from one address: after this many, each try waits longer (1, 2, 4 ... min). */
	maxFailuresPerPair: 5,
	firstDelayMs: 60 * 1000,
	/** From one address, whatever the accounts. */
	maxFailuresPerAddress: 20,
	/**
	 * For one account from anywhere: high enough that one outsider cannot lock a person out, low
	 * enough to stop guessing spread over many addresses.
	 */
	maxFailuresPerAccount: 50
} as const;

export type ThrottleVerdict =
	{ allowed: true; attemptId: string } | { allowed: false; retryAfterS: number; reason: string };

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

function failureTimes(
	tx: Tx,
	where: { email?: string; address?: string },
	since: number,
	order: 'newest' | 'oldest'
): number[] {
	return tx
		.select({ at: signInAttempt.at })
		.from(signInAttempt)
		.where(
			and(
				where.email === undefined ? undefined : eq(signInAttempt.email, where.email),
				where.address === undefined ? undefined : eq(signInAttempt.address, where.address),
				eq(signInAttempt.succeeded, false),
				gte(signInAttempt.at, new Date(since))
			)
		)
		.orderBy(order === 'newest' ? desc(signInAttempt.at) : asc(signInAttempt.at))
		.all()
		.map((r) => r.at.getTime());
}

/** A hard limit over the window: refused until the oldest failure that made it up ages out. */
function windowLockedUntil(times: number[], limit: number): number | null {
	return times.length < limit ? null : times[times.length - limit] + THROTTLE.windowMs;
}

/** For one account from one address: a delay after the last failure that doubles with each. */
function pairDelayedUntil(times: number[]): number | null {
	const over = times.length - THROTTLE.maxFailuresPerPair;
	if (over < 0) return null;
	const delay = Math.min(THROTTLE.windowMs, THROTTLE.firstDelayMs * 2 ** over);
	return times[0] + delay;
}

/** A wait in whole minutes, rounded up, for a refusal's "Try again in …". */
export function minutes(ms: number): string {
	const n = Math.max(1, Math.ceil(ms / 60_000));
	return `${n} minute${n === 1 ? '' : 's'}`;
}

function verdictAt(tx: Tx, email: string, address: string, now: number) {
	const since = now - THROTTLE.windowMs;
	const pair = pairDelayedUntil(failureTimes(tx, { email, address }, since, 'newest'));
	const account = windowLockedUntil(
		failureTimes(tx, { email }, since, 'oldest'),
		THROTTLE.maxFailuresPerAccount
	);
	const fromAddress = windowLockedUntil(
		failureTimes(tx, { address }, since, 'oldest'),
		THROTTLE.maxFailuresPerAddress
	);
	const until = Math.max(pair ?? 0, account ?? 0, fromAddress ?? 0);
	if (until <= now) return null;
	const wait = minutes(until - now);
	const reason =
		(fromAddress ?? 0) === until
			? `Too many failed sign-ins from this network address. Try again in ${wait}.`
			: `Too many failed tries of this account's password. Try again in ${wait}, or reset the password.`;
	return { retryAfterS: Math.ceil((until - now) / 1000), reason };
}

/**
 * Decides and counts one password try atomically: refused, or let through with its attempt
 * counted as a failure until `settleAttempt` says the password was right.
 */
export function claimAttempt(email: string, address: string, now = Date.now()): ThrottleVerdict {
	return db.transaction(
		(tx) => {
			const refused = verdictAt(tx, email, address, now);
			if (refused) return { allowed: false as const, ...refused };
			const { id } = tx
				.insert(signInAttempt)
				.values({ email, address, succeeded: false, at: new Date(now) })
				.returning({ id: signInAttempt.id })
				.get();
			return { allowed: true as const, attemptId: id };
		},
		{ behavior: 'immediate' }
	);
}

/** The password was right: the try no longer counts as a failure. */
export function settleAttempt(attemptId: string): void {
	db.update(signInAttempt).set({ succeeded: true }).where(eq(signInAttempt.id, attemptId)).run();
}

/** A past try, for tests and imports of history. */
export function recordSignInAttempt(
	email: string,
	address: string,
	succeeded: boolean,
	at = new Date()
): void {
	db.insert(signInAttempt).values({ email, address, succeeded, at }).run();
}

/** Whether a try now would be let through, without counting one. */
export function checkThrottle(
	email: string,
	address: string,
	now = Date.now()
): { allowed: true } | { allowed: false; retryAfterS: number; reason: string } {
	const refused = db.transaction((tx) => verdictAt(tx, email, address, now));
	return refused ? { allowed: false, ...refused } : { allowed: true };
}
