// Cursor pages for the API's sorted lists. A cursor carries the sort, the direction, the sort
// value of the last row a page gave and its id: the next page starts right after that row, so a
// row added or removed meanwhile neither repeats nor skips one, and a deep page costs what the first
// does (no OFFSET to count off).
import { Column, is, sql, type SQL, type SQLWrapper } from 'drizzle-orm';
import { z } from 'zod';
import { RuleError } from './rule-error';
import { limitAndSortFields, type SortDirection } from './list-paging';

export type SortValue = string | number | null;

export interface KeysetCursor {
	sort: string;
	dir: SortDirection;
	value: SortValue;
	/** The row's id, or its value in the list's tie-breaker when that is another unique column. */
	id: string;
}

export function encodeKeysetCursor(cursor: KeysetCursor): string {
	return Buffer.from(JSON.stringify([cursor.sort, cursor.dir, cursor.value, cursor.id])).toString(
		'base64url'
	);
}

export function decodeKeysetCursor(text: string): KeysetCursor | null {
	try {
		const parts: unknown = JSON.parse(Buffer.from(text, 'base64url').toString('utf8'));
		if (!Array.isArray(parts) || parts.length !== 4) return null;
		const [sort, dir, value, id] = parts;
		if (typeof sort !== 'string' || (dir !== 'asc' && dir !== 'desc') || typeof id !== 'string')
			return null;
		if (value !== null && typeof value !== 'string' && typeof value !== 'number') return null;
		return { sort, dir, value, id };
	} catch {
		return null;
	}
}

/** The raw sort value of a row, selected beside it so its page can end in a cursor. */
export function sortValueOf(column: SQLWrapper): SQL<SortValue> {
	return sql<SortValue>`${column}`;
}

/**
 * Rows after the cursor's row in the order `column dir, tieBreaker dir` (`orderFor`). SQLite puts
 * NULL before every value, so ascending pages read the NULLs first and descending pages last.
 * The values are compared as stored (a timestamp column's raw milliseconds, not a Date), as a row
 * value, so SQLite seeks an index on (column, tieBreaker) instead of counting off the rows before.
 * A column declared NOT NULL skips the NULL branch, which would stop that seek; one read through an
 * outer join may still be NULL, so pass it wrapped (sql`${column}`) to keep the branch.
 */
export function rowsAfter(column: SQLWrapper, tieBreaker: SQLWrapper, cursor: KeysetCursor): SQL {
	const beyond = sql.raw(cursor.dir === 'asc' ? '>' : '<');
	if (cursor.value === null) {
		const laterNull = sql`(${column} is null and ${tieBreaker} ${beyond} ${cursor.id})`;
		return cursor.dir === 'asc' ? sql`(${laterNull} or ${column} is not null)` : laterNull;
	}
	const later = sql`(${column}, ${tieBreaker}) ${beyond} (${cursor.value}, ${cursor.id})`;
	const mayBeNull = !(is(column, Column) && column.notNull);
	return cursor.dir === 'desc' && mayBeNull ? sql`(${later} or ${column} is null)` : later;
}

/** The query of a cursor page, as `keysetFields` reads it. */
export interface KeysetQuery<S extends string = string> {
	after?: string;
	limit: number;
	sort: S;
	dir: SortDirection;
}

/**
 * The query fields of a cursor list: `after` (the `next` of the page before), `limit`, `sort` and
 * `dir`. A cursor this list did not give, or one from the same list sorted otherwise, is refused
 * by name.
 */
export function keysetFields<S extends readonly [string, ...string[]]>(
	sorts: S,
	defaults: { sort: S[number]; dir: SortDirection }
) {
	return {
		after: z
			.string()
			.max(1000)
			.optional()
			.refine((v) => v === undefined || decodeKeysetCursor(v) !== null, {
				error: 'after must be the next cursor a previous page of this list gave.'
			})
			.describe('The `next` cursor of the page before; absent: the first page'),
		...limitAndSortFields(sorts, defaults)
	};
}

/** The documented answer of a cursor list: its rows as `items`, then `total`, `limit` and `next`. */
export function keysetPageSchema<I extends z.ZodType>(items: I, counted: string) {
	return z.object({
		items: z.array(items),
		total: z.int().describe(`Every ${counted} the filter matches, over all pages`),
		limit: z.int().describe('Rows per page, as asked'),
		next: z
			.string()
			.nullable()
			.describe('Pass as `after` (same sort and dir) for the next page; null on the last')
	});
}

/** A query's cursor, checked to belong to the same sort; a mismatch is a refusal naming `after`. */
export function cursorOf(query: {
	after?: string;
	sort: string;
	dir: SortDirection;
}): KeysetCursor | undefined {
	if (query.after === undefined) return undefined;
	const cursor = decodeKeysetCursor(query.after)!;
	if (cursor.sort !== query.sort || cursor.dir !== query.dir)
		throw new RuleError(
			`after was given by this list sorted by ${cursor.sort} ${cursor.dir}; ask with sort=${cursor.sort}&dir=${cursor.dir}, or start again without after.`,
			{ field: 'after' }
		);
	return cursor;
}

/** A cursor page: its rows, the honest count of every row the filter matches, and what comes next. */
export interface KeysetPage<T> {
	items: T[];
	total: number;
	limit: number;
	/** The cursor for the next page; null on the last one. */
	next: string | null;
}

/**
 * The page from `limit + 1` rows read (each with its `sortValue`): the extra row only says whether
 * another page follows, and the last row kept gives the cursor. `tieBreakerOf` is the row's value
 * in the list's tie-breaker column, its id unless the list orders ties by another unique column.
 */
export function keysetPageOf<T extends { id: string; sortValue: SortValue }>(
	rowsRead: T[],
	query: { limit: number; sort: string; dir: SortDirection },
	total: number,
	tieBreakerOf: (row: T) => string = (row) => row.id
): KeysetPage<Omit<T, 'sortValue'>> {
	const more = rowsRead.length > query.limit;
	const kept = rowsRead.slice(0, query.limit);
	const last = kept.at(-1);
	return {
		items: kept.map(({ sortValue: _sortValue, ...row }) => row),
		total,
		limit: query.limit,
		next:
			more && last
				? encodeKeysetCursor({
						sort: query.sort,
						dir: query.dir,
						value: last.sortValue,
						id: tieBreakerOf(last)
					})
				: null
	};
}
