// The API's lists page by cursor through their real route handlers: a walk of small pages in every
// sort and both directions gives what one big read gives, in the same order, no row twice and none
// missed; `total` is what a COUNT in SQL of the same filter says; a row added between two pages
// neither repeats nor shifts the walk; a bad cursor or limit is a 400 naming the parameter.
import type { RequestHandler } from '@sveltejs/kit';
import { sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { GET as getBatches } from '../../src/routes/api/v1/batches/+server';
import { GET as getComponents } from '../../src/routes/api/v1/components/+server';
import { GET as getLots } from '../../src/routes/api/v1/lots/+server';
import { GET as getRecipes } from '../../src/routes/api/v1/recipes/+server';
import { GET as getRuns } from '../../src/routes/api/v1/runs/+server';
import { GET as getStudies } from '../../src/routes/api/v1/studies/+server';
import { batchFilterOf, batchPageQuery } from '$lib/server/api/operations/batches';
import { lotFilterOf, lotPageQuery } from '$lib/server/api/operations/inventory';
import {
	componentFilterOf,
	componentPageQuery,
	recipeFilterOf,
	recipeListQuery
} from '$lib/server/api/operations/recipes';
import { runPageQuery } from '$lib/server/api/operations/runs';
import { studyPageQuery } from '$lib/server/api/operations/studies';
import { BATCH_SORTS, listBatchesPage } from '$lib/server/batches/batch-list';
import { COMPONENT_SORTS, listComponentsPage } from '$lib/server/components/component-list';
import { db } from '$lib/server/db';
import { batch, component, lot, run, study } from '$lib/server/db/schema';
import { LOT_SORTS, listLotsPage } from '$lib/server/inventory/lot-list';
import { encodeKeysetCursor } from '$lib/server/keyset';
import { MAX_PAGE_SIZE } from '$lib/server/list-paging';
import { listRecipes, RECIPE_SORTS } from '$lib/server/recipes/queries';
import { listRunsPage, RUN_SORTS } from '$lib/server/runs/run-list';
import { cloneRows } from '$lib/server/scale/clone-rows';
import { listStudiesPage, STUDY_SORTS } from '$lib/server/studies/study-list';
import { useDemoDatabase } from './demo-database';
import { callJson } from './endpoint-call';
import { makeUser } from './helpers';

useDemoDatabase();

vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

interface CursorPage {
	items: { id: string }[];
	total: number;
	limit: number;
	next: string | null;
}

interface ListUnderTest {
	path: string;
	handler: RequestHandler;
	sorts: readonly string[];
	/** Each filter's query and the COUNT in SQL, written here apart from the list's own code. */
	filters: [query: string, countSql: string][];
	/** The ids the HTML page lists by number (OFFSET) for the query: page 1 of up to 200 rows. */
	byPageNumber: (params: Record<string, string>) => string[];
}

let user: { id: string; email: string; name: string; roles: string[] };

async function read(list: ListUnderTest, query: string) {
	const response = await callJson(list.handler, 'GET', `${list.path}?${query}`, undefined, {
		user
	});
	return { response, body: (await response.json()) as CursorPage & Record<string, unknown> };
}

/** Every page of the query `limit` rows at a time, following `next` to the end. */
async function walk(list: ListUnderTest, query: string, limit: number) {
	const ids: string[] = [];
	const totals = new Set<number>();
	let after: string | null = null;
	let pages = 0;
	do {
		const cursor: string = after === null ? '' : `&after=${encodeURIComponent(after)}`;
		const { response, body } = await read(list, `${query}&limit=${limit}${cursor}`);
		expect(response.status, JSON.stringify(body)).toBe(200);
		expect(body.limit).toBe(limit);
		expect(body.items.length).toBeLessThanOrEqual(limit);
		if (body.next !== null) expect(body.items).toHaveLength(limit);
		ids.push(...body.items.map((item) => item.id));
		totals.add(body.total);
		after = body.next;
		if (++pages > 500) throw new Error(`${list.path}?${query}: the walk does not end`);
	} while (after !== null);
	return { ids, totals, pages };
}

const countOf = (countSql: string) => db.get<{ n: number }>(sql.raw(countSql))!.n;
const paramsOf = (query: string) => Object.fromEntries(new URLSearchParams(query));
const TERM = (column: string, term: string) => `lower(${column}) like '%${term}%'`;

const LISTS: ListUnderTest[] = [
	{
		path: '/api/v1/components',
		handler: getComponents,
		sorts: COMPONENT_SORTS,
		filters: [
			['', 'select count(*) n from component'],
			['category=salt', "select count(*) n from component where category = 'salt'"],
			[
				'q=sulf',
				`select count(*) n from component where ${['name', "coalesce(formula, '')", "coalesce(cas_number, '')", 'synonyms', 'ghs_hazards'].map((c) => TERM(c, 'sulf')).join(' or ')}`
			]
		],
		byPageNumber: (params) => {
			const query = componentPageQuery.parse({ ...params, page: 1, limit: MAX_PAGE_SIZE });
			return listComponentsPage(componentFilterOf(query), query).rows.map((r) => r.id);
		}
	},
	{
		path: '/api/v1/recipes',
		handler: getRecipes,
		sorts: RECIPE_SORTS,
		filters: [
			['', 'select count(*) n from recipe'],
			['kind=feed', "select count(*) n from recipe where kind = 'feed'"],
			[
				'status=approved',
				"select count(*) n from recipe r where exists (select 1 from recipe_version v where v.recipe_id = r.id and v.status = 'approved')"
			]
		],
		// The recipes page lists by name, ascending only.
		byPageNumber: (params) => {
			const query = recipeListQuery.parse(params);
			const ids = listRecipes({
				...recipeFilterOf(query),
				page: 1,
				pageSize: MAX_PAGE_SIZE
			}).rows.map((r) => r.id);
			return query.dir === 'asc' ? ids : ids.reverse();
		}
	},
	{
		path: '/api/v1/lots',
		handler: getLots,
		sorts: LOT_SORTS,
		filters: [
			['', 'select count(*) n from lot'],
			['status=released', "select count(*) n from lot where status = 'released'"],
			[
				'q=cursor-lot&expiringBefore=2027-01-03',
				`select count(*) n from lot l left join component c on c.id = l.component_id
				 where (${['l.code', 'l.supplier', 'l.supplier_lot', 'c.name'].map((c) => TERM(c, 'cursor-lot')).join(' or ')})
				 and l.expires_on <= '2027-01-03'`
			]
		],
		byPageNumber: (params) => {
			const query = lotPageQuery.parse({ ...params, page: 1, limit: MAX_PAGE_SIZE });
			return listLotsPage(lotFilterOf(query), query).rows.map((r) => r.id);
		}
	},
	{
		path: '/api/v1/batches',
		handler: getBatches,
		sorts: BATCH_SORTS,
		filters: [
			['', 'select count(*) n from batch'],
			['state=planned', "select count(*) n from batch where state = 'planned'"],
			[
				'from=2026-03-02&to=2026-03-04',
				"select count(*) n from batch where planned_on between '2026-03-02' and '2026-03-04'"
			]
		],
		byPageNumber: (params) => {
			const query = batchPageQuery.parse({ ...params, page: 1, limit: MAX_PAGE_SIZE });
			return listBatchesPage(batchFilterOf(query), query).rows.map((r) => r.id);
		}
	},
	{
		path: '/api/v1/studies',
		handler: getStudies,
		sorts: STUDY_SORTS,
		filters: [
			['', 'select count(*) n from study'],
			['q=cursor', `select count(*) n from study where ${TERM('name', 'cursor')}`]
		],
		byPageNumber: (params) => {
			const query = studyPageQuery.parse({ ...params, page: 1, limit: MAX_PAGE_SIZE });
			return listStudiesPage(query.q, query).rows.map((r) => r.id);
		}
	},
	{
		path: '/api/v1/runs',
		handler: getRuns,
		sorts: RUN_SORTS,
		filters: [
			['', 'select count(*) n from run'],
			['q=cursor', `select count(*) n from run where ${TERM('name', 'cursor')}`]
		],
		byPageNumber: (params) => {
			const query = runPageQuery.parse({ ...params, page: 1, limit: MAX_PAGE_SIZE });
			return listRunsPage(query.q, query).rows.map((r) => r.id);
		}
	}
];

/**
 * Rows of our own beside the demo's, copied from demo rows in SQL with ties in every sort column
 * (few dates, states, volumes, vessels), so the tie-breaker decides much of each order.
 */
function addRowsWithTies() {
	const firstId = (table: string, where: string) =>
		db.get<{ id: string }>(sql.raw(`select id from ${table} where ${where} order by id limit 1`))!
			.id;
	const releasedLot = firstId('lot', "status = 'released' and component_id is not null");
	const quarantinedLot = firstId('lot', "status = 'quarantine'");
	const plannedBatch = firstId('batch', "state = 'planned'");
	const releasedBatch = firstId('batch', "state = 'released'");
	const demoStudy = firstId('study', '1 = 1');
	const demoRun = firstId('run', '1 = 1');
	db.transaction((tx) => {
		for (const [template, tag] of [
			[releasedLot, 'r'],
			[quarantinedLot, 'q']
		])
			cloneRows(tx, lot, `t.id = '${template}'`, 30, {
				id: `'cursor-lot-${tag}-' || n.i`,
				code: `'L-CURSOR-${tag}-' || printf('%02d', n.i)`,
				supplier: `'Cursor Supply ' || (n.i % 3)`,
				supplier_lot: `'CURSOR-LOT-${tag}-' || n.i`,
				expires_on: `date('2027-01-01', '+' || (n.i % 4) || ' days')`,
				received_on: `date('2026-01-01', '+' || (n.i % 2) || ' days')`
			});
		for (const [template, tag] of [
			[plannedBatch, 'p'],
			[releasedBatch, 'r']
		])
			cloneRows(tx, batch, `t.id = '${template}'`, 20, {
				id: `'cursor-batch-${tag}-' || n.i`,
				number: `'B-CURSOR-${tag}-' || printf('%02d', n.i)`,
				number_year: tag === 'p' ? '1998' : '1997',
				number_seq: 'n.i',
				planned_on: `date('2026-03-01', '+' || (n.i % 5) || ' days')`,
				target_volume_ml: `(1 + n.i % 3) * 1000`,
				intended_use: `'Cursor use ' || (n.i % 4)`
			});
		cloneRows(tx, study, `t.id = '${demoStudy}'`, 20, {
			id: `'cursor-study-' || n.i`,
			name: `'Cursor study ' || printf('%02d', n.i)`,
			vessel_id: `case n.i % 2 when 0 then (select min(id) from vessel) else (select max(id) from vessel) end`,
			updated_at: `1767225600000 + (n.i % 4) * 1000`
		});
		cloneRows(tx, run, `t.id = '${demoRun}'`, 20, {
			id: `'cursor-run-' || n.i`,
			number: `'R-CURSOR-' || printf('%02d', n.i)`,
			name: `'Cursor run ' || (n.i % 5)`,
			started_at: `1767225600000 + (n.i % 3) * 60000`
		});
	});
}

beforeAll(async () => {
	const person = await makeUser(['engineer', 'media_scientist', 'inventory_lead']);
	user = { id: person.id, email: person.email, name: 'Cursor', roles: person.roles };
	addRowsWithTies();
});

describe('the data under test', () => {
	it('has sorts with NULLs and ties, and fits one big read per list', () => {
		expect(countOf('select count(*) n from component where formula is null')).toBeGreaterThan(1);
		expect(countOf('select count(*) n from component where cas_number is null')).toBeGreaterThan(1);
		for (const [table, least] of [
			['lot', 80],
			['batch', 40],
			['study', 20],
			['run', 20]
		] as const) {
			const n = countOf(`select count(*) n from ${table}`);
			expect(n).toBeGreaterThanOrEqual(least);
			expect(n).toBeLessThanOrEqual(MAX_PAGE_SIZE);
		}
	});
});

describe.each(LISTS)('GET $path by cursor', (list) => {
	const cases = list.filters.flatMap(([filter, countSql]) =>
		list.sorts.flatMap((sort) =>
			(['asc', 'desc'] as const).map((dir) => ({ filter, countSql, sort, dir }))
		)
	);

	it.each(cases)(
		'walks ?$filter sorted by $sort $dir as one big read gives it, with the SQL count as total',
		async ({ filter, countSql, sort, dir }) => {
			const query = `${filter}&sort=${sort}&dir=${dir}`;
			const whole = await read(list, `${query}&limit=${MAX_PAGE_SIZE}`);
			expect(whole.response.status).toBe(200);
			expect(whole.body.next).toBeNull();
			const bigRead = whole.body.items.map((item) => item.id);
			const expected = countOf(countSql);
			expect(whole.body.total).toBe(expected);
			expect(bigRead).toHaveLength(expected);
			expect(list.byPageNumber(paramsOf(query))).toEqual(bigRead);

			const limit = Math.max(2, Math.ceil(expected / 6));
			const { ids, totals, pages } = await walk(list, query, limit);
			expect(ids).toEqual(bigRead);
			expect(new Set(ids).size).toBe(ids.length);
			expect([...totals]).toEqual([expected]);
			expect(pages).toBe(Math.max(1, Math.ceil(expected / limit)));
		}
	);

	it.each([
		['after=not-a-cursor', 'after'],
		[`after=${Buffer.from('["name","asc"]').toString('base64url')}`, 'after'],
		['limit=0', 'limit'],
		[`limit=${MAX_PAGE_SIZE + 1}`, 'limit'],
		['limit=two', 'limit']
	])('refuses %s as a problem at %s', async (query, path) => {
		const { response, body } = await read(list, query);
		expect(response.status).toBe(400);
		expect(response.headers.get('content-type')).toContain('application/problem+json');
		expect((body.errors as { path: string }[]).map((e) => e.path)).toEqual([path]);
		expect(body.detail).toContain(path);
	});

	it('refuses a cursor given for another sort or direction, naming after', async () => {
		const [sort, otherSort = sort] = list.sorts;
		const first = await read(list, `sort=${sort}&dir=asc&limit=1`);
		expect(first.body.next).not.toBeNull();
		for (const query of [`sort=${otherSort}&dir=desc`, `sort=${sort}&dir=desc`]) {
			const { response, body } = await read(list, `${query}&after=${first.body.next}`);
			expect(response.status).toBe(400);
			expect(response.headers.get('content-type')).toContain('application/problem+json');
			expect(body.errors).toEqual([{ path: 'after', message: expect.stringContaining(sort) }]);
		}
		const same = await read(list, `sort=${sort}&dir=asc&limit=1&after=${first.body.next}`);
		expect(same.response.status).toBe(200);
	});
});

describe('rows added between two pages', () => {
	const lots = LISTS.find((l) => l.path === '/api/v1/lots')!;
	const components = LISTS.find((l) => l.path === '/api/v1/components')!;

	it('neither repeat nor shift a walk of lots; one after the cursor is met in its place', async () => {
		const query = 'q=cursor-lot&sort=expiresOn&dir=asc';
		const before = (await read(lots, `${query}&limit=${MAX_PAGE_SIZE}`)).body;
		const first = (await read(lots, `${query}&limit=7`)).body;
		// One lot that sorts before the cursor's row (the earliest expiry), one after it (the latest).
		const template = first.items[0].id;
		db.transaction((tx) => {
			cloneRows(tx, lot, `t.id = '${template}'`, 1, {
				id: `'cursor-lot-early'`,
				code: `'L-CURSOR-EARLY'`,
				supplier_lot: `'CURSOR-LOT-EARLY'`,
				expires_on: `'2026-12-01'`
			});
			cloneRows(tx, lot, `t.id = '${template}'`, 1, {
				id: `'cursor-lot-late'`,
				code: `'L-CURSOR-LATE'`,
				supplier_lot: `'CURSOR-LOT-LATE'`,
				expires_on: `'2028-01-01'`
			});
		});
		const ids = first.items.map((item) => item.id);
		let after = first.next;
		let total = first.total;
		while (after !== null) {
			const page = (await read(lots, `${query}&limit=7&after=${after}`)).body;
			ids.push(...page.items.map((item) => item.id));
			({ next: after, total } = page);
		}
		expect(new Set(ids).size).toBe(ids.length);
		expect(ids).not.toContain('cursor-lot-early');
		expect(ids.at(-1)).toBe('cursor-lot-late');
		expect(ids.slice(0, -1)).toEqual(before.items.map((item) => item.id));
		expect(total).toBe(before.total + 2);
	});

	it('keep a walk of components through their NULL formulas in step', async () => {
		const query = 'sort=formula&dir=asc';
		const before = (await read(components, `${query}&limit=${MAX_PAGE_SIZE}`)).body;
		const nullFormulas = countOf('select count(*) n from component where formula is null');
		const first = (await read(components, `${query}&limit=2`)).body;
		// Both without a formula: ordered among the NULLs by id, one before the cursor, one after.
		for (const id of ['!cursor-first', '~cursor-last'])
			db.insert(component)
				.values({
					id,
					name: `Cursor component ${id}`,
					category: 'other',
					ghsHazards: [],
					synonyms: []
				})
				.run();
		const ids = first.items.map((item) => item.id);
		let after = first.next;
		while (after !== null) {
			const page = (await read(components, `${query}&limit=2&after=${after}`)).body;
			ids.push(...page.items.map((item) => item.id));
			after = page.next;
		}
		expect(new Set(ids).size).toBe(ids.length);
		expect(ids).not.toContain('!cursor-first');
		expect(ids.indexOf('~cursor-last')).toBe(nullFormulas);
		expect(ids.filter((id) => id !== '~cursor-last')).toEqual(before.items.map((i) => i.id));
	});

	it('a cursor made by hand past every row gives an empty last page', async () => {
		const after = encodeKeysetCursor({ sort: 'code', dir: 'asc', value: '\u{10FFFF}', id: '' });
		const { response, body } = await read(lots, `sort=code&dir=asc&after=${after}`);
		expect(response.status).toBe(200);
		expect(body).toMatchObject({
			items: [],
			next: null,
			total: countOf('select count(*) n from lot')
		});
	});
});
