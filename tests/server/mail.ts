import { desc } from 'drizzle-orm';
import type { SMTPServer } from 'smtp-server';
import { afterAll, beforeAll } from 'vitest';
import { db } from '$lib/server/db';
import { mailMessage } from '$lib/server/db/schema';
import { startMailStandIn } from '$lib/server/mail/stand-in';

/** Starts the real stand-in SMTP server on this file's port for the duration of the file. */
export function useMailStandIn(): void {
	let server: SMTPServer;
	beforeAll(async () => {
		server = await startMailStandIn(Number(process.env.SMTP_PORT));
	});
	afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));
}

export function latestMailTo(address: string) {
	return db
		.select()
		.from(mailMessage)
		.orderBy(desc(mailMessage.receivedAt))
		.all()
		.find((m) => m.recipients.includes(address));
}

export function linkIn(text: string, path: 'invite' | 'reset'): string {
	const match = text.match(new RegExp(`https?://\\S+/${path}/([A-Za-z0-9_-]+)`));
	if (!match) throw new Error(`No ${path} link in: ${text}`);
	return match[1];
}
