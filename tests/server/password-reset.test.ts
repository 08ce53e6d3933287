import { describe, expect, it } from 'vitest';
import { validateSessionToken } from '$lib/server/auth/sessions';
import { signIn } from '$lib/server/auth/sign-in';
import {
	completePasswordReset,
	inspectPasswordReset,
	requestPasswordReset,
	RESET_LIFETIME_MS
} from '$lib/server/people';
import { listAuditEvents } from '$lib/server/audit';
import { makeUser } from './helpers';
import { latestMailTo, linkIn, useMailStandIn } from './mail';

useMailStandIn();

async function resetLinkFor(email: string, now = new Date()) {
	await requestPasswordReset(email, '127.0.0.1', now).mailSent;
	return linkIn(latestMailTo(email)!.textBody, 'reset');
}

describe('password reset by e-mail', () => {
	it('sets the new password, ends old sessions, and works only once', async () => {
		const person = await makeUser();
		const before = await signIn(person.email, person.password, '127.0.0.1');
		expect(before.ok).toBe(true);
		const token = await resetLinkFor(person.email);
		await completePasswordReset(token, 'fresh-medium-batch-7', '127.0.0.1');
		if (before.ok) expect(validateSessionToken(before.issued.token)).toBeNull();
		expect((await signIn(person.email, person.password, '127.0.0.3')).ok).toBe(false);
		expect((await signIn(person.email, 'fresh-medium-batch-7', '127.0.0.3')).ok).toBe(true);
		expect(inspectPasswordReset(token).state).toBe('used');
		await expect(completePasswordReset(token, 'yet-another-secret-9', '127.0.0.1')).rejects.toThrow(
			/already been used/
		);
	});

	it('expires after one hour', async () => {
		const person = await makeUser();
		const issued = new Date('2026-05-04T10:00:00Z');
		const token = await resetLinkFor(person.email, issued);
		expect(
			inspectPasswordReset(token, new Date(issued.getTime() + RESET_LIFETIME_MS - 1000)).state
		).toBe('valid');
		const late = new Date(issued.getTime() + RESET_LIFETIME_MS + 1000);
		expect(inspectPasswordReset(token, late).state).toBe('expired');
		await expect(
			completePasswordReset(token, 'fresh-medium-batch-7', '127.0.0.1', late)
		).rejects.toThrow(/expired/);
		expect((await signIn(person.email, person.password, '127.0.0.4')).ok).toBe(true);
	});

	it('answers an unknown address the same way, sends nothing, and records the request', async () => {
		await requestPasswordReset('nobody-here@lab.test', '127.0.0.1').mailSent;
		expect(latestMailTo('nobody-here@lab.test')).toBeUndefined();
		const entry = listAuditEvents({ action: 'password.reset_unknown', page: 1, pageSize: 5 })
			.rows[0];
		expect(entry.actorEmail).toBe('nobody-here@lab.test');
	});
});
