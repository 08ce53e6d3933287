import { integer, text } from 'drizzle-orm/sqlite-core';

/** Column builders every table shares: text ids from crypto.randomUUID() and millisecond times. */
export const id = () =>
	text('id')
		.primaryKey()
		.$defaultFn(() => crypto.randomUUID());

export const createdAt = () =>
	integer('created_at', { mode: 'timestamp_ms' })
		.notNull()
		.$defaultFn(() => new Date());
