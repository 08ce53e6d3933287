import { describe, expect, it } from 'vitest';
import { signIn } from '$lib/server/auth/sign-in';
import { checkThrottle, recordSignInAttempt, THROTTLE } from '$lib/server/auth/throttle';
import { makeUser } from './helpers';

describe('sign-in throttling', () => {
	it('refuses the sixth try after five failures for one account, even with the right password', async () => {
		const person = await makeUser();
		for (let i = 0; i < 5; i++) {
			const outcome = await signIn(person.email, 'wrong-password-here', '192.0.2.10');
			expect(outcome).toMatchObject({ ok: false, status: 401, field: 'password' });
		}
		const refused = await signIn(person.email, person.password, '192.0.2.11');
		expect(refused.ok).toBe(false);
		if (refused.ok) return;
		expect(refused.status).toBe(429);
		expect(refused.message).toMatch(
			/Too many failed sign-ins for this account\. Try again in 15 minutes/
		);
		expect(refused.retryAfterS).toBeGreaterThan(14 * 60);
	});

	it('lifts the refusal once the failures are older than 15 minutes', async () => {
		const person = await makeUser();
		const past = Date.now() - THROTTLE.windowMs - 1000;
		for (let i = 0; i < 5; i++)
			recordSignInAttempt(person.email, '192.0.2.20', false, new Date(past + i));
		expect(checkThrottle(person.email, '192.0.2.20').allowed).toBe(true);
		const outcome = await signIn(person.email, person.password, '192.0.2.20');
		expect(outcome.ok).toBe(true);
	});

	it('does not count successful sign-ins', async () => {
		const person = await makeUser();
		for (let i = 0; i < 8; i++) {
			const outcome = await signIn(person.email, person.password, '192.0.2.30');
			expect(outcome.ok).toBe(true);
		}
	});

	it('refuses an address after 20 failures across accounts, and only that address', async () => {
		const address = '198.51.100.7';
		const now = Date.now();
		for (let i = 0; i < 20; i++)
			recordSignInAttempt(`nobody${i}@lab.test`, address, false, new Date(now - 1000 + i));
		const verdict = checkThrottle('someone-new@lab.test', address, now);
		expect(verdict.allowed).toBe(false);
		if (!verdict.allowed) expect(verdict.reason).toMatch(/from this network address/);
		expect(checkThrottle('someone-new@lab.test', '198.51.100.8', now).allowed).toBe(true);
		const person = await makeUser();
		const refused = await signIn(person.email, person.password, address);
		expect(refused).toMatchObject({ ok: false, status: 429 });
	});

	it('says which part was wrong: unknown e-mail against wrong password', async () => {
		const person = await makeUser();
		expect(
			await signIn('no-such-person@lab.test', 'whatever-long-pass', '192.0.2.40')
		).toMatchObject({
			ok: false,
			field: 'email',
			message: 'No account uses this e-mail address.'
		});
		expect(
			await signIn(person.email.toUpperCase(), 'whatever-long-pass', '192.0.2.40')
		).toMatchObject({
			ok: false,
			field: 'password'
		});
	});
});
