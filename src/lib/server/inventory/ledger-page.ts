// A lot's ledger a page at a time, newest first, by keyset on the (lot, at, id) index: a lot weighed
// into thousands of batches shows its latest entries at once, and each earlier page costs the same.
import { and, count, desc, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import { cursorFields, decodeCursorParts, encodeCursor } from '../cursor';
import { db } from '../db';
import { stockEntry, user } from '../db/schema';
import { DEFAULT_PAGE_SIZE } from '../list-paging';

export interface LedgerCursor {
	atMs: number;
	id: string;
}

export function encodeLedgerCursor(cursor: LedgerCursor): string {
	return encodeCursor([cursor.atMs, cursor.id]);
}

export function decodeLedgerCursor(text: string): LedgerCursor | null {
	const parts = decodeCursorParts(text, 2);
	const atMs = Number(parts?.[0]);
	return parts && Number.isSafeInteger(atMs) ? { atMs, id: parts[1] } : null;
}

export const ledgerPageQuery = z.object(cursorFields('before', decodeLedgerCursor, 'earlier'));

export interface LedgerPage {
	entries: {
		id: string;
		at: Date;
		kind: typeof stockEntry.$inferSelect.kind;
		quantity: number;
		reason: string;
		batchId: string | null;
		by: string | null;
	}[];
	/** every entry of the lot */
	total: number;
	/** the cursor of the next page back; null on the earliest */
	earlier: string | null;
}

/** The `limit` entries of a lot before the cursor (absent: the latest), newest first. */
export function lotLedgerPage(
	lotId: string,
	{ before, limit = DEFAULT_PAGE_SIZE }: { before?: LedgerCursor | null; limit?: number } = {}
): LedgerPage {
	const rows = db
		.select({
			id: stockEntry.id,
			at: stockEntry.at,
			kind: stockEntry.kind,
			quantity: stockEntry.quantity,
			reason: stockEntry.reason,
			batchId: stockEntry.batchId,
			by: user.email
		})
		.from(stockEntry)
		.leftJoin(user, eq(stockEntry.actorId, user.id))
		.where(
			and(
				eq(stockEntry.lotId, lotId),
				before
					? sql`(${stockEntry.at}, ${stockEntry.id}) < (${before.atMs}, ${before.id})`
					: undefined
			)
		)
		.orderBy(desc(stockEntry.at), desc(stockEntry.id))
		.limit(limit + 1)
		.all();
	const entries = rows.slice(0, limit);
	const last = entries.at(-1);
	const [{ total }] = db
		.select({ total: count() })
		.from(stockEntry)
		.where(eq(stockEntry.lotId, lotId))
		.all();
	return {
		entries,
		total,
		earlier:
			rows.length > limit && last
				? encodeLedgerCursor({ atMs: last.at.getTime(), id: last.id })
				: null
	};
}
