// A signed-in person changes their own password: the old one is required (and counted with their
// sign-in tries), the new one meets the policy, other sessions and open reset links end.
import { and, eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { changeOwnPassword } from '$lib/server/auth/change-password';
import { createSession, validateSessionToken } from '$lib/server/auth/sessions';
import { signIn } from '$lib/server/auth/sign-in';
import { THROTTLE } from '$lib/server/auth/throttle';
import { db } from '$lib/server/db';
import { auditEvent } from '$lib/server/db/schema';
import { findUser, inspectPasswordReset, requestPasswordReset } from '$lib/server/people';
import { makeUser, refusalOf } from './helpers';
import { latestMailTo, linkIn, useMailStandIn } from './mail';

useMailStandIn();

const ADDRESS = '10.2.3.4';

async function signedInTwice() {
	const person = await makeUser();
	const here = createSession(person.id);
	const elsewhere = createSession(person.id);
	return { person, here, elsewhere, row: () => findUser(person.id)! };
}

describe('changing one’s own password', () => {
	it('needs the current password, keeps this session and ends the others', async () => {
		const { person, here, elsewhere, row } = await signedInTwice();
		const outcome = await changeOwnPassword(
			row(),
			{ currentPassword: person.password, newPassword: 'lantern-harbour-mosaic' },
			{ sessionId: here.session.id, address: ADDRESS }
		);
		expect(outcome).toEqual({ sessionsEnded: 1 });
		expect(validateSessionToken(here.token)?.user.id).toBe(person.id);
		expect(validateSessionToken(elsewhere.token)).toBeNull();
		expect((await signIn(person.email, person.password, ADDRESS)).ok).toBe(false);
		expect((await signIn(person.email, 'lantern-harbour-mosaic', ADDRESS)).ok).toBe(true);
		const audit = db
			.select()
			.from(auditEvent)
			.where(and(eq(auditEvent.action, 'password.changed'), eq(auditEvent.subjectId, person.id)))
			.all();
		expect(audit.map((a) => a.detail)).toEqual([{ sessionsEnded: 1 }]);
	});

	it('refuses a wrong current password and changes nothing', async () => {
		const { person, here, elsewhere, row } = await signedInTwice();
		const refusal = await refusalOf(() =>
			changeOwnPassword(
				row(),
				{ currentPassword: 'not-my-password', newPassword: 'lantern-harbour-mosaic' },
				{ sessionId: here.session.id, address: ADDRESS }
			)
		);
		expect(refusal.field).toBe('currentPassword');
		expect(refusal.message).toBe('The current password is not right. Your password is unchanged.');
		expect(validateSessionToken(elsewhere.token)?.user.id).toBe(person.id);
		expect((await signIn(person.email, person.password, ADDRESS)).ok).toBe(true);
	});

	it('refuses a guessable or unchanged new password on the new-password field', async () => {
		const { person, here, row } = await signedInTwice();
		const change = (newPassword: string) =>
			refusalOf(() =>
				changeOwnPassword(
					row(),
					{ currentPassword: person.password, newPassword },
					{ sessionId: here.session.id, address: ADDRESS }
				)
			);
		const weak = await change('qwertyuiopas');
		expect(weak.field).toBe('password');
		expect(weak.message).toMatch(/too easy to guess/);
		const same = await change(person.password);
		expect(same.message).toMatch(/same as the current one/);
	});

	it('counts wrong current passwords with sign-in tries, so the page cannot be used to guess', async () => {
		const { person, here, row } = await signedInTwice();
		for (let i = 0; i < THROTTLE.maxFailuresPerPair; i++) {
			await refusalOf(() =>
				changeOwnPassword(
					row(),
					{ currentPassword: `wrong-${i}`, newPassword: 'lantern-harbour-mosaic' },
					{ sessionId: here.session.id, address: ADDRESS }
				)
			);
		}
		const held = await refusalOf(() =>
			changeOwnPassword(
				row(),
				{ currentPassword: person.password, newPassword: 'lantern-harbour-mosaic' },
				{ sessionId: here.session.id, address: ADDRESS }
			)
		);
		expect(held.status).toBe(429);
		expect(held.message).toMatch(/Try again in 1 minute/);
		const signInNow = await signIn(person.email, person.password, ADDRESS);
		expect(signInNow.ok).toBe(false);
	});

	it('voids a reset link still open, so it cannot undo the change', async () => {
		const { person, here, row } = await signedInTwice();
		await requestPasswordReset(person.email, ADDRESS).mailSent;
		const link = linkIn(latestMailTo(person.email)!.textBody, 'reset');
		expect(inspectPasswordReset(link).state).toBe('valid');
		await changeOwnPassword(
			row(),
			{ currentPassword: person.password, newPassword: 'lantern-harbour-mosaic' },
			{ sessionId: here.session.id, address: ADDRESS }
		);
		expect(inspectPasswordReset(link).state).toBe('used');
	});
});
