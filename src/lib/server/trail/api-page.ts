// The trail for scripts: the same filter as the trail page, a page at a time by keyset cursor on
// the (at, seq) index, so a client walks a site's whole trail at the same cost per page.

import { auditEventsAfter, countAuditEvents, type AuditFilter, type AuditKey } from '../audit';
import { decodeCursorParts, encodeCursor } from '../cursor';
import { readableEntries } from './entries';

export function encodeAuditCursor(key: AuditKey): string {
	return encodeCursor([key.atMs, key.seq]);
}

export function decodeAuditCursor(text: string): AuditKey | null {
	const [atMs, seq] = decodeCursorParts(text, 2)?.map(Number) ?? [];
	return Number.isSafeInteger(atMs) && Number.isSafeInteger(seq) ? { atMs, seq } : null;
}

/** `limit` entries matching the filter after the cursor, in the filter's order, with their count. */
export function auditApiPage(filter: AuditFilter, after: AuditKey | null, limit: number) {
	const rows = auditEventsAfter(filter, after, limit + 1);
	const shown = rows.slice(0, limit);
	const sentences = readableEntries(shown);
	const last = shown.at(-1);
	return {
		entries: shown.map((row, i) => ({
			id: row.id,
			seq: row.seq ?? 0,
			at: row.at,
			actorId: row.actorId,
			actorEmail: row.actorEmail,
			action: row.action,
			sentence: sentences[i].sentence,
			subjectType: row.subjectType,
			subjectId: row.subjectId,
			detail: row.detail ?? null,
			address: row.address
		})),
		total: countAuditEvents(filter),
		next:
			rows.length > limit && last
				? encodeAuditCursor({ atMs: last.at.getTime(), seq: last.seq ?? 0 })
				: null
	};
}

export type AuditApiPage = ReturnType<typeof auditApiPage>;
