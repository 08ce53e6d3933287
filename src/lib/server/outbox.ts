import { count, desc, eq } from 'drizzle-orm';
import { db } from './db';
import { mailMessage } from './db/schema';

export function listMail(page: number, pageSize: number) {
	const [{ total }] = db.select({ total: count() }).from(mailMessage).all();
	const rows = db
		.select({
			id: mailMessage.id,
			receivedAt: mailMessage.receivedAt,
			recipients: mailMessage.recipients,
			subject: mailMessage.subject
		})
		.from(mailMessage)
		.orderBy(desc(mailMessage.receivedAt))
		.limit(pageSize)
		.offset((page - 1) * pageSize)
		.all();
	return { rows, total };
}

export function findMail(id: string) {
	return db.select().from(mailMessage).where(eq(mailMessage.id, id)).get();
}

/** One-time links in mail: an invitation or a password reset, with the token that opens it. */
const ONE_TIME_LINK = /(https?:\/\/[^\s<>"]*\/(?:invite|reset)\/)[A-Za-z0-9_-]+/g;

function hideOneTimeLinks(text: string): string {
	return text.replace(ONE_TIME_LINK, '$1[hidden: only its recipient may open it]');
}

/**
 * A message as an administrator may read it: outside the demo, the one-time links in mail to
 * someone else are hidden, so reading the outbox cannot take over that person's account.
 */
export function mailForReader<
	M extends { recipients: string[]; textBody: string; htmlBody: string | null }
>(mail: M, readerEmail: string, demo: boolean): M & { linksHidden: boolean } {
	const own = mail.recipients.some((r) => r.toLowerCase() === readerEmail.toLowerCase());
	if (demo || own) return { ...mail, linksHidden: false };
	const textBody = hideOneTimeLinks(mail.textBody);
	const htmlBody = mail.htmlBody === null ? null : hideOneTimeLinks(mail.htmlBody);
	const linksHidden = textBody !== mail.textBody || htmlBody !== mail.htmlBody;
	return { ...mail, textBody, htmlBody, linksHidden };
}
