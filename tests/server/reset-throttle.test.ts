// Reset requests are throttled without telling which addresses have accounts: too many from one
// network address are refused openly; past a few for one e-mail address no more mail goes out.
import { and, eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { RESET_THROTTLE } from '$lib/server/auth/reset-throttle';
import { db } from '$lib/server/db';
import { auditEvent, mailMessage } from '$lib/server/db/schema';
import { requestPasswordReset } from '$lib/server/people';
import { makeUser, refusalOf } from './helpers';
import { useMailStandIn } from './mail';

useMailStandIn();

const mailsTo = (email: string) =>
	db
		.select()
		.from(mailMessage)
		.all()
		.filter((m) => m.recipients.includes(email)).length;

describe('reset request throttle', () => {
	it('refuses requests from one network address past the limit, whatever the e-mail', async () => {
		const address = '10.9.0.1';
		const start = Date.now();
		for (let i = 0; i < RESET_THROTTLE.maxRequestsPerAddress; i++) {
			const at = new Date(start + i * 1000);
			await requestPasswordReset(`nobody-${i}@lab.test`, address, at).mailSent;
		}
		const refusal = await refusalOf(() =>
			requestPasswordReset('nobody-else@lab.test', address, new Date(start + 20_000))
		);
		expect(refusal.status).toBe(429);
		expect(refusal.field).toBe('email');
		expect(refusal.message).toBe(
			'Too many reset requests from this network address. Try again in 15 minutes.'
		);
		// Another address is not held, and the window passes.
		expect(() => requestPasswordReset('nobody@lab.test', '10.9.0.2')).not.toThrow();
		const later = new Date(start + RESET_THROTTLE.windowMs + 1000);
		expect(() => requestPasswordReset('nobody@lab.test', address, later)).not.toThrow();
	});

	it('sends at most a few mails per e-mail address and answers the same after', async () => {
		const person = await makeUser();
		const start = Date.now();
		for (let i = 0; i < RESET_THROTTLE.maxMailsPerEmail + 3; i++) {
			// From different addresses, as a person trying to flood someone's mailbox would.
			const answer = requestPasswordReset(person.email, `10.9.1.${i}`, new Date(start + i));
			await answer.mailSent;
		}
		expect(mailsTo(person.email)).toBe(RESET_THROTTLE.maxMailsPerEmail);
		const dropped = db
			.select()
			.from(auditEvent)
			.where(
				and(eq(auditEvent.action, 'password.reset_throttled'), eq(auditEvent.subjectId, person.id))
			)
			.all();
		expect(dropped).toHaveLength(3);
	});
});
