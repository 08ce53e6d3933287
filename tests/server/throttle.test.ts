import { describe, expect, it } from 'vitest';
import { signIn } from '$lib/server/auth/sign-in';
import { checkThrottle, recordSignInAttempt, THROTTLE } from '$lib/server/auth/throttle';
import { signRecord } from '$lib/server/signatures';
import { makeUser } from './helpers';

describe('sign-in throttling', () => {
	it('after five failures from one address, the next try waits, even with the right password; the wait doubles', async () => {
		const person = await makeUser();
		for (let i = 0; i < 5; i++) {
			const outcome = await signIn(person.email, 'wrong-password-here', '192.0.2.10');
			expect(outcome).toMatchObject({ ok: false, status: 401, field: 'password' });
		}
		const refused = await signIn(person.email, person.password, '192.0.2.10');
		expect(refused).toMatchObject({ ok: false, status: 429 });
		if (refused.ok) return;
		expect(refused.message).toMatch(
			/Too many failed tries of this account's password\. Try again in 1 minute/
		);
		expect(refused.retryAfterS).toBeGreaterThan(50);
		expect(refused.retryAfterS).toBeLessThanOrEqual(60);
		// One more failure (as if after the wait) doubles it.
		recordSignInAttempt(person.email, '192.0.2.10', false);
		const later = checkThrottle(person.email, '192.0.2.10');
		expect(later.allowed).toBe(false);
		if (!later.allowed) expect(later.retryAfterS).toBeGreaterThan(110);
	});

	it('an outsider’s failures do not lock the person out from their own address', async () => {
		const person = await makeUser();
		for (let i = 0; i < 10; i++) await signIn(person.email, 'guessing-here-1', '203.0.113.66');
		expect((await signIn(person.email, person.password, '192.0.2.11')).ok).toBe(true);
	});

	it('counts a try before its password is checked: 30 concurrent wrong tries, at most 5 evaluated', async () => {
		const person = await makeUser();
		const outcomes = await Promise.all(
			Array.from({ length: 30 }, () => signIn(person.email, 'wrong-password-here', '192.0.2.12'))
		);
		const evaluated = outcomes.filter((o) => !o.ok && o.status === 401);
		const throttled = outcomes.filter((o) => !o.ok && o.status === 429);
		expect(evaluated.length).toBeLessThanOrEqual(THROTTLE.maxFailuresPerPair);
		expect(evaluated.length + throttled.length).toBe(30);
	});

	it('signature passwords share the count with sign-in', async () => {
		const person = await makeUser();
		const sign = (password: string) =>
			signRecord(
				{
					user: person,
					password,
					meaning: 'verified',
					subjectType: 'test',
					subjectId: 't',
					address: '192.0.2.13'
				},
				() => undefined
			);
		for (let i = 0; i < 5; i++) await expect(sign('not-the-password')).rejects.toThrow(/not right/);
		await expect(sign(person.password)).rejects.toThrow(/Too many failed tries/);
		const refused = await signIn(person.email, person.password, '192.0.2.13');
		expect(refused).toMatchObject({ ok: false, status: 429 });
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

	it('gives one answer for an unknown e-mail and a wrong password', async () => {
		const person = await makeUser();
		expect(
			await signIn('no-such-person@lab.test', 'whatever-long-pass', '192.0.2.40')
		).toMatchObject({
			ok: false,
			field: 'password',
			message: 'The e-mail address or the password is not right. Check both, or reset the password.'
		});
		expect(
			await signIn(person.email.toUpperCase(), 'whatever-long-pass', '192.0.2.40')
		).toMatchObject({
			ok: false,
			field: 'password'
		});
	});
});
