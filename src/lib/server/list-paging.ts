import { asc, desc, type SQL, type SQLWrapper } from 'drizzle-orm';
import { z } from 'zod';
import { MAX_PAGE } from './paging';

export const DEFAULT_PAGE_SIZE = 50;
export const MAX_PAGE_SIZE = 200;

export type SortDirection = 'asc' | 'desc';

export interface Paging<S extends string> {
	page: number;
	limit: number;
	sort: S;
	dir: SortDirection;
}

function wholeNumber(label: string, max: number) {
	return z.coerce
		.number({ error: `${label} must be a whole number.` })
		.int(`${label} must be a whole number.`)
		.min(1, `${label} starts at 1.`)
		.max(max, `${label} is at most ${max}.`);
}

/** `limit`, `sort` and `dir`: what a list's page by number and its page by cursor both read. */
export function limitAndSortFields<S extends readonly [string, ...string[]]>(
	sorts: S,
	defaults: { sort: S[number]; dir: SortDirection }
) {
	return {
		limit: wholeNumber('limit', MAX_PAGE_SIZE)
			.default(DEFAULT_PAGE_SIZE)
			.describe(`Rows per page (at most ${MAX_PAGE_SIZE})`),
		sort: z
			.enum(sorts, { error: `sort must be one of ${sorts.join(', ')}.` })
			.default(defaults.sort as never)
			.describe('Column to sort by'),
		dir: z
			.enum(['asc', 'desc'], { error: 'dir must be asc or desc.' })
			.default(defaults.dir)
			.describe('Sort direction')
	};
}

/**
 * The paging and sorting parameters of a list, as query fields: `page` (from 1), `limit` (rows per
 * page), `sort` (one of the list's columns) and `dir`. The API refuses bad ones with a 400 naming
 * the parameter; a page falls back to the default for each (see `lenientQuery`).
 */
export function pagingFields<S extends readonly [string, ...string[]]>(
	sorts: S,
	defaults: { sort: S[number]; dir: SortDirection }
) {
	return {
		page: wholeNumber('page', MAX_PAGE).default(1).describe('Page number, from 1'),
		...limitAndSortFields(sorts, defaults)
	};
}

/**
 * A page's query parameters through the same schema as the API, but a bad value falls back to its
 * default: a stale bookmark still shows a list instead of an error.
 */
export function lenientQuery<S extends z.ZodObject>(schema: S, url: URL): z.infer<S> {
	const raw: Record<string, string> = Object.fromEntries(
		[...url.searchParams.entries()].filter(([, v]) => v !== '')
	);
	for (let attempt = 0; attempt < 20; attempt++) {
		const parsed = schema.safeParse(raw);
		if (parsed.success) return parsed.data;
		for (const issue of parsed.error.issues) delete raw[String(issue.path[0])];
	}
	return schema.parse({});
}

/** ORDER BY the chosen column, then the tie-breaker, so pages never repeat or skip a row. */
export function orderFor(column: SQLWrapper, dir: SortDirection, tieBreaker: SQLWrapper): SQL[] {
	const by = dir === 'asc' ? asc : desc;
	return [by(column), by(tieBreaker)];
}

/** A list's sort names from its map of sort columns, as the tuple `pagingFields` takes. */
export function sortKeys<T extends Record<string, unknown>>(columns: T) {
	return Object.keys(columns) as [keyof T & string, ...(keyof T & string)[]];
}

export function offsetOf(paging: { page: number; limit: number }): number {
	return (paging.page - 1) * paging.limit;
}

/** A page of rows and the honest count of every row the filter matches. */
export interface ListPage<T> {
	rows: T[];
	total: number;
}
