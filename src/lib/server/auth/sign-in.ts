import type { Cookies } from '@sveltejs/kit';
import { recordAudit } from '../audit';
import { findUserByEmail, normaliseEmail } from '../people';
import { spendVerificationTime, verifyPassword } from './passwords';
import {
	createSession,
	deleteSessionCookie,
	invalidateSession,
	type IssuedSession
} from './sessions';
import { claimAttempt, settleAttempt } from './throttle';

const NOT_RIGHT =
	'The e-mail address or the password is not right. Check both, or reset the password.';

export type SignInOutcome =
	| { ok: true; userId: string; issued: IssuedSession }
	| {
			ok: false;
			status: 401 | 403 | 429;
			field?: 'email' | 'password';
			message: string;
			retryAfterS?: number;
	  };

export async function signIn(
	emailInput: string,
	password: string,
	address: string
): Promise<SignInOutcome> {
	const email = normaliseEmail(emailInput);
	const throttle = claimAttempt(email, address);
	if (!throttle.allowed) {
		recordAudit(
			{ id: null, email, address },
			{
				action: 'sign_in.refused',
				detail: { reason: 'throttled', retryAfterS: throttle.retryAfterS }
			}
		);
		return { ok: false, status: 429, message: throttle.reason, retryAfterS: throttle.retryAfterS };
	}
	const account = findUserByEmail(email);
	const fail = (field: 'email' | 'password', message: string, reason: string): SignInOutcome => {
		recordAudit(
			{ id: account?.id ?? null, email, address },
			{
				action: 'sign_in.failed',
				subjectType: account ? 'user' : undefined,
				subjectId: account?.id,
				detail: { reason }
			}
		);
		return { ok: false, status: 401, field, message };
	};
	// One answer, in the same time, whether the address is unknown or the password wrong: the
	// form must not tell which addresses have accounts.
	if (!account) {
		await spendVerificationTime(password);
		return fail('password', NOT_RIGHT, 'unknown_email');
	}
	if (!(await verifyPassword(account.passwordHash, password))) {
		return fail('password', NOT_RIGHT, 'wrong_password');
	}
	if (!account.active) {
		recordAudit(
			{ id: account.id, email, address },
			{
				action: 'sign_in.refused',
				subjectType: 'user',
				subjectId: account.id,
				detail: { reason: 'deactivated' }
			}
		);
		return {
			ok: false,
			status: 403,
			field: 'email',
			message: 'This account is deactivated. Ask an administrator.'
		};
	}
	settleAttempt(throttle.attemptId);
	const issued = createSession(account.id);
	recordAudit(
		{ id: account.id, email, address },
		{ action: 'sign_in.succeeded', subjectType: 'user', subjectId: account.id }
	);
	return { ok: true, userId: account.id, issued };
}

export async function signOut(
	cookies: Cookies,
	sessionId: string,
	actor: { id: string; email: string; address: string }
) {
	invalidateSession(sessionId);
	deleteSessionCookie(cookies);
	recordAudit(actor, { action: 'sign_out', subjectType: 'user', subjectId: actor.id });
}
