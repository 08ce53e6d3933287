// No takeover through mail: the stand-in takes mail only from the app, and outside the demo the
// outbox hides one-time links in mail to other people.
import nodemailer from 'nodemailer';
import { describe, expect, it } from 'vitest';
import { config } from '$lib/server/config';
import { sendMail } from '$lib/server/mail/send';
import { mailForReader } from '$lib/server/outbox';
import { latestMailTo, useMailStandIn } from './mail';

useMailStandIn();

function stranger(auth?: { user: string; pass: string }) {
	return nodemailer.createTransport({
		host: '127.0.0.1',
		port: config.smtp.port,
		secure: false,
		ignoreTLS: true,
		auth,
		connectionTimeout: 5_000
	});
}

describe('the mail stand-in', () => {
	it('takes the app’s own mail', async () => {
		await sendMail({ to: 'own@lab.test', subject: 'From the app', text: 'Hello' });
		expect(latestMailTo('own@lab.test')?.subject).toBe('From the app');
	});

	it('refuses mail from a process without the secret, or with a wrong one', async () => {
		const mail = { from: 'x@evil.test', to: 'victim@lab.test', subject: 'Forged', text: 'x' };
		await expect(stranger().sendMail(mail)).rejects.toThrow();
		await expect(stranger({ user: 'brothwright', pass: 'guess' }).sendMail(mail)).rejects.toThrow(
			/Only Brothwright may post/
		);
		expect(latestMailTo('victim@lab.test')).toBeUndefined();
	});
});

describe('the outbox outside the demo', () => {
	const reset = {
		recipients: ['someone@lab.test'],
		textBody: 'Set a new password: https://lab.example/reset/AbC_123-xyz (valid 1 hour).',
		htmlBody: '<a href="https://lab.example/reset/AbC_123-xyz">Set a new password</a>'
	};

	it('hides another person’s one-time link from the administrator, keeps the rest', () => {
		const shown = mailForReader(reset, 'admin@lab.test', false);
		expect(shown.linksHidden).toBe(true);
		expect(shown.textBody).toBe(
			'Set a new password: https://lab.example/reset/[hidden: only its recipient may open it] (valid 1 hour).'
		);
		expect(shown.htmlBody).not.toContain('AbC_123-xyz');
	});

	it('shows the link to its own recipient, and everything in the demo', () => {
		expect(mailForReader(reset, 'Someone@lab.test', false).textBody).toContain('AbC_123-xyz');
		expect(mailForReader(reset, 'admin@lab.test', true).textBody).toContain('AbC_123-xyz');
	});
});
