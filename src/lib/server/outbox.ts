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
