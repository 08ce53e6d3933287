import { and, desc, eq, gte } from 'drizzle-orm';
import { db } from '../db';
import { signInAttempt } from '../db/schema';

export const THROTTLE = {
	windowMs: 15 * 60 * 1000,
	maxFailuresPerAccount: 5,
	maxFailuresPerAddress: 20
} as const;

export type ThrottleVerdict =
	{ allowed: true } | { allowed: false; retryAfterS: number; reason: string };

/**
 * Only failures count. Once the limit is reached within the window, tries are refused until the
 * oldest failure that made up the limit ages out of the window: at most 15 minutes.
 */
function lockedUntil(failureTimes: number[], limit: number): number | null {
	if (failureTimes.length < limit) return null;
	const oldestOfLimit = failureTimes[limit - 1];
	return oldestOfLimit + THROTTLE.windowMs;
}

function recentFailures(column: 'email' | 'address', value: string, now: number, limit: number) {
	return db
		.select({ at: signInAttempt.at })
		.from(signInAttempt)
		.where(
			and(
				eq(column === 'email' ? signInAttempt.email : signInAttempt.address, value),
				eq(signInAttempt.succeeded, false),
				gte(signInAttempt.at, new Date(now - THROTTLE.windowMs))
			)
		)
		.orderBy(desc(signInAttempt.at))
		.limit(limit)
		.all()
		.map((r) => r.at.getTime());
}

export function checkThrottle(email: string, address: string, now = Date.now()): ThrottleVerdict {
	const byAccount = lockedUntil(
		recentFailures('email', email, now, THROTTLE.maxFailuresPerAccount),
		THROTTLE.maxFailuresPerAccount
	);
	const byAddress = lockedUntil(
		recentFailures('address', address, now, THROTTLE.maxFailuresPerAddress),
		THROTTLE.maxFailuresPerAddress
	);
	const until = Math.max(byAccount ?? 0, byAddress ?? 0);
	if (until <= now) return { allowed: true };
	const retryAfterS = Math.ceil((until - now) / 1000);
	const minutes = Math.ceil(retryAfterS / 60);
	const reason =
		byAccount !== null && byAccount > now
			? `Too many failed sign-ins for this account. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}, or reset the password.`
			: `Too many failed sign-ins from this network address. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`;
	return { allowed: false, retryAfterS, reason };
}

export function recordSignInAttempt(
	email: string,
	address: string,
	succeeded: boolean,
	at = new Date()
): void {
	db.insert(signInAttempt).values({ email, address, succeeded, at }).run();
}
