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

/**
 * A tamper-evident chain: `seq` orders the rows, `prev_hash` is the previous row's `row_hash`, and
 * `row_hash` is the SHA-256 of this row's content with both (src/lib/server/trail/chain.ts).
 * Nullable only for rows written before the chain existed, which start-up seals once.
 */
export const chainColumns = () => ({
	seq: integer('seq'),
	prevHash: text('prev_hash'),
	rowHash: text('row_hash')
});
