// The lot and batch lists page, sort and search on the server, in the API (by cursor) and the pages
// (by number) alike; the API refuses paging parameters out of range with a 400 naming them, a page
// falls back.
import { describe, expect, it, vi } from 'vitest';
import { GET as getLots } from '../../src/routes/api/v1/lots/+server';
import { GET as getBatches } from '../../src/routes/api/v1/batches/+server';
import { lotPageQuery } from '$lib/server/api/operations/inventory';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { lenientQuery, MAX_PAGE_SIZE } from '$lib/server/list-paging';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { component } from '$lib/server/db/schema';
import { callJson } from './endpoint-call';
import { makeLead, makeLot } from './inventory-fixtures';

vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

async function lotsApi(query: string, user: unknown) {
	const response = await callJson(getLots, 'GET', `/api/v1/lots?${query}`, undefined, { user });
	return { status: response.status, body: await response.json() };
}

describe('lists paged on the server', () => {
	it('pages lots by the chosen column with an honest total', async () => {
		seedReferenceLibrary();
		const lead = await makeLead();
		for (const supplierLot of ['P-03', 'P-01', 'P-05', 'P-02', 'P-04'])
			makeLot(lead.actor, { supplierLot });
		const first = await lotsApi('sort=supplier&dir=asc&limit=2&q=P-0', lead);
		expect(first.status).toBe(200);
		expect(first.body.total).toBe(5);
		expect(first.body.items.map((l: { supplierLot: string }) => l.supplierLot)).toEqual([
			'P-01',
			'P-02'
		]);
		const second = await lotsApi(
			`sort=supplier&dir=asc&limit=2&q=P-0&after=${first.body.next}`,
			lead
		);
		const last = await lotsApi(
			`sort=supplier&dir=asc&limit=2&q=P-0&after=${second.body.next}`,
			lead
		);
		expect(last.body.items.map((l: { supplierLot: string }) => l.supplierLot)).toEqual(['P-05']);
		expect(last.body).toMatchObject({ total: 5, limit: 2, next: null });
	});

	it('searches through the trigram index, kept in step when a component is renamed', async () => {
		const lead = await makeLead();
		makeLot(lead.actor, { component: 'calcium-chloride-dihydrate', supplierLot: 'TRI-77' });
		const search = async (q: string) =>
			(await lotsApi(`q=${encodeURIComponent(q)}&limit=200`, lead)).body.items.map(
				(l: { supplierLot: string }) => l.supplierLot
			);
		expect(await search('tri-77')).toEqual(['TRI-77']);
		expect(await search('chloride dihyd')).toContain('TRI-77');
		db.update(component)
			.set({ name: 'Calcium chloride, dihydrate (renamed)' })
			.where(eq(component.id, 'calcium-chloride-dihydrate'))
			.run();
		expect(await search('(renamed)')).toEqual(['TRI-77']);
		// Shorter than a trigram: matched by a scan instead. FTS5 syntax in a term is plain text.
		expect(await search('77')).toContain('TRI-77');
		for (const odd of ['"', 'NEAR(a b)', 'a OR b', '*', '-x'])
			expect((await lotsApi(`q=${encodeURIComponent(odd)}`, lead)).status).toBe(200);
	});

	it.each([
		['after=not-a-cursor', 'after', 'after must be the next cursor a previous page'],
		[`limit=${MAX_PAGE_SIZE + 1}`, 'limit', `limit is at most ${MAX_PAGE_SIZE}.`],
		['sort=price', 'sort', 'sort must be one of'],
		['dir=sideways', 'dir', 'dir must be asc or desc.']
	])('the API refuses %s with a 400 naming %s', async (query, path, message) => {
		const lead = await makeLead();
		const { status, body } = await lotsApi(query, lead);
		expect(status).toBe(400);
		expect(body.errors.map((e: { path: string }) => e.path)).toEqual(
			expect.arrayContaining([path])
		);
		expect(body.errors.every((e: { path: string }) => e.path === path)).toBe(true);
		expect(body.detail).toContain(message);
		const batches = await callJson(getBatches, 'GET', `/api/v1/batches?${query}`, undefined, {
			user: lead
		});
		expect(batches.status).toBe(400);
	});

	it.each([
		['page=0', 'page starts at 1.'],
		['page=abc', 'page must be a whole number.'],
		['page=99999999999999999999', 'page is at most 1000000.']
	])('the page query refuses %s by name', (query, message) => {
		const parsed = lotPageQuery.safeParse(Object.fromEntries(new URLSearchParams(query)));
		expect(parsed.success).toBe(false);
		expect(parsed.error!.issues.every((i) => i.path.join('.') === 'page')).toBe(true);
		expect(parsed.error!.issues.map((i) => i.message)).toContain(message);
	});

	it('a page falls back to the default for each bad parameter and keeps the good ones', () => {
		const url = new URL('http://127.0.0.1/lots?page=-2&sort=onHand&dir=sideways&status=released');
		expect(lenientQuery(lotPageQuery, url)).toMatchObject({
			page: 1,
			limit: 50,
			sort: 'onHand',
			dir: 'asc',
			status: 'released'
		});
	});
});
