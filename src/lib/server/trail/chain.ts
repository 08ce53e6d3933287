// The audit trail and the signatures as hash chains: each row's `row_hash` is the SHA-256 of its
// table, its content, its `seq` and the previous row's hash, so changing, removing or inserting a
// row anywhere breaks every link after it. A database trigger makes each new row continue the chain;
// verify-trail.ts recomputes it. (SQLite has no SHA-256 of its own, so the hash is computed here.)
import { createHash } from 'node:crypto';
import type Database from 'better-sqlite3';

/** The chained tables and the content columns each row's hash covers, in order. */
export const CHAINED_TABLES = {
	audit_event: [
		'id',
		'at',
		'actor_id',
		'actor_email',
		'action',
		'subject_type',
		'subject_id',
		'detail',
		'address'
	],
	e_signature: [
		'id',
		'signer_id',
		'signer_email',
		'signer_name',
		'meaning',
		'subject_type',
		'subject_id',
		'subject_digest',
		'comment',
		'signed_at'
	]
} as const;

export type ChainedTable = keyof typeof CHAINED_TABLES;

/** A row as SQLite stores it: times in ms, JSON as its text. */
export type StoredRow = Record<string, string | number | null>;

export interface ChainLink {
	seq: number;
	prevHash: string | null;
	rowHash: string;
}

export function rowHash(
	table: ChainedTable,
	row: StoredRow,
	seq: number,
	prevHash: string | null
): string {
	const content = CHAINED_TABLES[table].map((column) => row[column] ?? null);
	return createHash('sha256')
		.update(JSON.stringify([table, seq, prevHash, ...content]))
		.digest('hex');
}

/** The last link of a chain, or null for an empty table. */
export function lastLink(
	sqlite: Database.Database,
	table: ChainedTable
): { seq: number; rowHash: string | null } | null {
	return (
		(sqlite
			.prepare(`SELECT seq, row_hash AS rowHash FROM ${table} ORDER BY seq DESC LIMIT 1`)
			.get() as { seq: number; rowHash: string | null } | undefined) ?? null
	);
}

/**
 * The link for a new row. Call inside the transaction that inserts it: better-sqlite3 is
 * synchronous, so nothing can append between this read and the insert.
 */
export function nextLink(
	sqlite: Database.Database,
	table: ChainedTable,
	row: StoredRow
): ChainLink {
	const last = lastLink(sqlite, table);
	const seq = (last?.seq ?? 0) + 1;
	const prevHash = last?.rowHash ?? null;
	return { seq, prevHash, rowHash: rowHash(table, row, seq, prevHash) };
}

/** Hashes rows written before the chain existed, in order; a no-op once they are sealed. */
export function sealUnchainedRows(sqlite: Database.Database): number {
	let sealed = 0;
	for (const table of Object.keys(CHAINED_TABLES) as ChainedTable[]) {
		const unsealed = sqlite
			.prepare(`SELECT * FROM ${table} WHERE row_hash IS NULL ORDER BY seq`)
			.all() as StoredRow[];
		if (unsealed.length === 0) continue;
		const seal = sqlite.prepare(`UPDATE ${table} SET prev_hash = ?, row_hash = ? WHERE id = ?`);
		const previous = sqlite.prepare(`SELECT row_hash AS rowHash FROM ${table} WHERE seq = ?`);
		sqlite.transaction(() => {
			for (const row of unsealed) {
				const seq = Number(row.seq);
				const before = previous.get(seq - 1) as { rowHash: string | null } | undefined;
				const prevHash = before?.rowHash ?? null;
				seal.run(prevHash, rowHash(table, row, seq, prevHash), row.id);
				sealed++;
			}
		})();
	}
	return sealed;
}
