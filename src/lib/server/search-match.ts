import { sql, type SQL } from 'drizzle-orm';

/** Terms shorter than this are matched with LIKE: a trigram index needs three characters. */
const TRIGRAM = 3;

/**
 * A condition that `idColumn` is a record whose indexed text contains `term` (case-insensitive),
 * through a trigram FTS5 table (see drizzle/0033_search_indexes.sql). A shorter term falls back to
 * `likeFallback`, a scan. The term goes in as one quoted phrase, so FTS5 operators in it are text.
 */
export function searchMatch(
	idColumn: SQL | SQL.Aliased | { getSQL(): SQL },
	index: { table: 'lot_search' | 'batch_search'; idColumn: 'lot_id' | 'batch_id' },
	term: string,
	likeFallback: (pattern: string) => SQL
): SQL {
	const trimmed = term.trim();
	if ([...trimmed].length < TRIGRAM) {
		return likeFallback(`%${trimmed.toLowerCase().replace(/[%_]/g, '')}%`);
	}
	const phrase = `"${trimmed.replace(/"/g, '""')}"`;
	return sql`${idColumn} in (select ${sql.raw(index.idColumn)} from ${sql.raw(index.table)} where ${sql.raw(index.table)} match ${phrase})`;
}
