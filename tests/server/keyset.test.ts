// rowsAfter on its own: a walk of a small table page by page, through NULLs and ties, in both
// directions, gives the order SQLite's ORDER BY gives; a NOT NULL sort seeks its index.
import { sql, type SQLWrapper } from 'drizzle-orm';
import { integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import {
	decodeKeysetCursor,
	encodeKeysetCursor,
	keysetPageOf,
	rowsAfter,
	sortValueOf,
	type SortValue
} from '$lib/server/keyset';
import { orderFor, type SortDirection } from '$lib/server/list-paging';

const probe = sqliteTable('keyset_probe', {
	id: text('id').primaryKey(),
	label: text('label'),
	rank: integer('rank').notNull(),
	seenAt: integer('seen_at', { mode: 'timestamp_ms' }).notNull()
});

// Labels with NULLs and ties; ranks with ties; times as whole milliseconds.
const ROWS = [
	['a', null, 3, 5],
	['b', 'beta', 1, 1],
	['c', null, 2, 5],
	['d', 'alpha', 3, 2],
	['e', 'beta', 2, 9],
	['f', null, 1, 1],
	['g', 'alpha', 2, 5],
	['h', 'gamma', 3, 9],
	['i', null, 2, 2]
] as const;

beforeAll(() => {
	db.run(
		sql`create table keyset_probe (id text primary key, label text, rank integer not null, seen_at integer not null)`
	);
	db.run(sql`create index keyset_probe_rank_idx on keyset_probe (rank, id)`);
	for (const [id, label, rank, seenAt] of ROWS)
		db.run(sql`insert into keyset_probe values (${id}, ${label}, ${rank}, ${seenAt})`);
});

/** Every id, `pageSize` at a time, each page starting after the cursor of the one before. */
function walk(column: SQLWrapper, dir: SortDirection, pageSize: number): string[] {
	const query = { sort: 'probe', dir, limit: pageSize };
	const ids: string[] = [];
	let after: string | null = null;
	do {
		const cursor = after === null ? undefined : decodeKeysetCursor(after)!;
		const rowsRead: { id: string; sortValue: SortValue }[] = db
			.select({ id: probe.id, sortValue: sortValueOf(column) })
			.from(probe)
			.where(cursor && rowsAfter(column, probe.id, cursor))
			.orderBy(...orderFor(column, dir, probe.id))
			.limit(pageSize + 1)
			.all();
		const page = keysetPageOf(rowsRead, query, ROWS.length);
		ids.push(...page.items.map((row) => row.id));
		after = page.next;
	} while (after !== null);
	return ids;
}

function wholeOrder(column: SQLWrapper, dir: SortDirection): string[] {
	return db
		.select({ id: probe.id })
		.from(probe)
		.orderBy(...orderFor(column, dir, probe.id))
		.all()
		.map((row) => row.id);
}

describe('rowsAfter', () => {
	it.each([
		['a nullable column, NULLs first ascending', probe.label, 'asc'],
		['a nullable column, NULLs last descending', probe.label, 'desc'],
		['an expression (counted as nullable)', sql`upper(${probe.label})`, 'desc'],
		['a NOT NULL column with ties', probe.rank, 'asc'],
		['a NOT NULL column with ties, descending', probe.rank, 'desc'],
		['a timestamp column, by its stored milliseconds', probe.seenAt, 'desc']
	] as const)('walks %s as ORDER BY gives it', (_what, column, dir) => {
		const expected = wholeOrder(column, dir);
		expect(expected).toHaveLength(ROWS.length);
		for (const pageSize of [1, 2, 4]) expect(walk(column, dir, pageSize)).toEqual(expected);
	});

	it('reads NULLs first ascending and last descending, as SQLite orders them', () => {
		const nullIds = ['a', 'c', 'f', 'i'];
		expect(walk(probe.label, 'asc', 2).slice(0, 4)).toEqual(nullIds);
		expect(walk(probe.label, 'desc', 2).slice(-4)).toEqual([...nullIds].reverse());
	});

	it('starts after a NULL cursor row among the NULLs, and after a value among its ties', () => {
		const idsAfter = (column: SQLWrapper, dir: SortDirection, value: SortValue, id: string) => {
			const cursor = { sort: 'probe', dir, value, id };
			return db
				.select({ id: probe.id })
				.from(probe)
				.where(rowsAfter(column, probe.id, cursor))
				.orderBy(...orderFor(column, dir, probe.id))
				.all()
				.map((row) => row.id);
		};
		expect(idsAfter(probe.label, 'asc', null, 'c')).toEqual(['f', 'i', 'd', 'g', 'b', 'e', 'h']);
		expect(idsAfter(probe.label, 'desc', null, 'f')).toEqual(['c', 'a']);
		expect(idsAfter(probe.label, 'desc', 'beta', 'e')).toEqual(['b', 'g', 'd', 'i', 'f', 'c', 'a']);
		expect(idsAfter(probe.rank, 'asc', 2, 'e')).toEqual(['g', 'i', 'a', 'd', 'h']);
	});

	it('lets SQLite seek the (column, id) index of a NOT NULL column in both directions', () => {
		for (const dir of ['asc', 'desc'] as const) {
			const cursor = { sort: 'rank', dir, value: 2, id: 'e' };
			const query = db
				.select({ id: probe.id })
				.from(probe)
				.where(rowsAfter(probe.rank, probe.id, cursor))
				.orderBy(...orderFor(probe.rank, dir, probe.id))
				.toSQL();
			const plan = db.$client
				.prepare(`explain query plan ${query.sql}`)
				.all(...query.params)
				.map((row) => (row as { detail: string }).detail)
				.join('\n');
			expect(plan, dir).toMatch(
				/SEARCH keyset_probe USING (COVERING )?INDEX keyset_probe_rank_idx/
			);
		}
	});

	it('round-trips a cursor and refuses text that is not one', () => {
		const cursor = { sort: 'label', dir: 'desc' as const, value: null, id: 'c' };
		expect(decodeKeysetCursor(encodeKeysetCursor(cursor))).toEqual(cursor);
		for (const text of ['', 'not-a-cursor', Buffer.from('[1,2,3,4]').toString('base64url')])
			expect(decodeKeysetCursor(text)).toBeNull();
	});
});
