import { describe, expect, it } from 'vitest';
import { listAuditEvents } from '$lib/server/audit';
import { signIn } from '$lib/server/auth/sign-in';
import {
	acceptInvitation,
	findUserByEmail,
	INVITATION_LIFETIME_MS,
	inspectInvitation,
	invitePerson,
	rolesOf
} from '$lib/server/people';
import { RuleError } from '$lib/server/rule-error';
import { makeUser } from './helpers';
import { latestMailTo, linkIn, useMailStandIn } from './mail';

useMailStandIn();

async function invite(email: string, now = new Date()) {
	const admin = await makeUser(['admin']);
	const outcome = await invitePerson(
		{ id: admin.id, email: admin.email, name: 'Site Admin', address: '127.0.0.1' },
		{ email, name: 'New Colleague', roles: ['engineer', 'inventory_lead'] },
		now
	);
	expect(outcome.mailError).toBeUndefined();
	const mail = latestMailTo(email);
	expect(mail?.subject).toBe('Your invitation to Brothwright');
	return linkIn(mail!.textBody, 'invite');
}

describe('invitations', () => {
	it('arrive by mail through the stand-in, and the link creates the account with its roles', async () => {
		const token = await invite('new.colleague@lab.test');
		const userId = await acceptInvitation(token, {
			name: 'New Colleague',
			password: 'sterile-broth-figure',
			address: '127.0.0.1'
		});
		expect(findUserByEmail('new.colleague@lab.test')?.id).toBe(userId);
		expect(rolesOf(userId)).toEqual(['engineer', 'inventory_lead']);
		expect((await signIn('new.colleague@lab.test', 'sterile-broth-figure', '127.0.0.2')).ok).toBe(
			true
		);
		expect(
			listAuditEvents({ action: 'person.invit', page: 1, pageSize: 10 }).total
		).toBeGreaterThanOrEqual(2);
	});

	it('work only once', async () => {
		const token = await invite('once-only@lab.test');
		await acceptInvitation(token, {
			name: 'Once',
			password: 'sterile-broth-figure',
			address: '127.0.0.1'
		});
		expect(inspectInvitation(token).state).toBe('used');
		await expect(
			acceptInvitation(token, {
				name: 'Twice',
				password: 'another-long-secret',
				address: '127.0.0.1'
			})
		).rejects.toThrow(/already been used/);
	});

	it('expire after 72 hours', async () => {
		const issued = new Date('2026-03-02T08:00:00Z');
		const token = await invite('late-reader@lab.test', issued);
		const justBefore = new Date(issued.getTime() + INVITATION_LIFETIME_MS - 1000);
		const justAfter = new Date(issued.getTime() + INVITATION_LIFETIME_MS + 1000);
		expect(inspectInvitation(token, justBefore).state).toBe('valid');
		expect(inspectInvitation(token, justAfter).state).toBe('expired');
		await expect(
			acceptInvitation(
				token,
				{ name: 'Late', password: 'sterile-broth-figure', address: '127.0.0.1' },
				justAfter
			)
		).rejects.toThrow(/expired/);
		expect(findUserByEmail('late-reader@lab.test')).toBeUndefined();
	});

	it('are replaced by a newer invitation to the same address', async () => {
		const first = await invite('twice-invited@lab.test');
		const second = await invite('twice-invited@lab.test');
		expect(inspectInvitation(first).state).toBe('used');
		expect(inspectInvitation(second).state).toBe('valid');
	});

	it('refuse a weak password and keep the invitation usable', async () => {
		const token = await invite('weak-choice@lab.test');
		await expect(
			acceptInvitation(token, { name: 'Weak', password: 'password1234', address: '127.0.0.1' })
		).rejects.toBeInstanceOf(RuleError);
		expect(inspectInvitation(token).state).toBe('valid');
	});

	it('refuse an unknown link and an address that already has an account', async () => {
		expect(inspectInvitation('not-a-real-token').state).toBe('unknown');
		const existing = await makeUser();
		const admin = await makeUser(['admin']);
		await expect(
			invitePerson(
				{ id: admin.id, email: admin.email, name: 'A' },
				{ email: existing.email, name: '', roles: ['engineer'] }
			)
		).rejects.toThrow(/already has an account/);
	});
});
