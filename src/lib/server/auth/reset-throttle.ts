import { and, count, eq, gte, min } from 'drizzle-orm';
import { db } from '../db';
import { resetRequest } from '../db/schema';
import { minutes } from './throttle';

/**
 * Reset links asked for. From one network address the requests are limited and refused openly
 * (that tells nothing about accounts); for one e-mail address only a few mails go out per window
 * and the rest are dropped silently, so the answer is the same whether or not an account exists.
 */
export const RESET_THROTTLE = {
	windowMs: 15 * 60 * 1000,
	maxRequestsPerAddress: 10,
	maxMailsPerEmail: 3
} as const;

export type ResetClaim =
	{ allowed: true; mayMail: boolean } | { allowed: false; retryAfterS: number; reason: string };

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

function requestsSince(tx: Tx, where: { email: string } | { address: string }, since: Date) {
	const matches =
		'email' in where
			? eq(resetRequest.email, where.email)
			: eq(resetRequest.address, where.address);
	return tx
		.select({ n: count(), oldest: min(resetRequest.at) })
		.from(resetRequest)
		.where(and(matches, gte(resetRequest.at, since)))
		.get()!;
}

/** Decides and counts one reset request in one transaction, so concurrent requests cannot slip past. */
export function claimResetRequest(email: string, address: string, now = Date.now()): ResetClaim {
	const since = new Date(now - RESET_THROTTLE.windowMs);
	return db.transaction(
		(tx) => {
			const fromAddress = requestsSince(tx, { address }, since);
			if (fromAddress.n >= RESET_THROTTLE.maxRequestsPerAddress && fromAddress.oldest) {
				const waitMs = fromAddress.oldest.getTime() + RESET_THROTTLE.windowMs - now;
				return {
					allowed: false as const,
					retryAfterS: Math.ceil(waitMs / 1000),
					reason: `Too many reset requests from this network address. Try again in ${minutes(waitMs)}.`
				};
			}
			tx.insert(resetRequest)
				.values({ email, address, at: new Date(now) })
				.run();
			const forEmail = requestsSince(tx, { email }, since);
			return { allowed: true as const, mayMail: forEmail.n <= RESET_THROTTLE.maxMailsPerEmail };
		},
		{ behavior: 'immediate' }
	);
}
