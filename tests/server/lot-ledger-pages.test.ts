// A lot's ledger a page at a time: newest first by keyset, every entry exactly once across the
// pages, the lot view carrying only the latest page, and bad paging refused with a 400.
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { adjustLot } from '$lib/server/inventory/lots';
import { db } from '$lib/server/db';
import { appendStockEntry, ledgerOf } from '$lib/server/inventory/ledger';
import { lotView } from '$lib/server/inventory/view';
import Papa from 'papaparse';
import { csvText } from '$lib/server/csv-export';
import { ledgerExport } from '$lib/server/inventory/csv';
import { callJson } from './endpoint-call';
import { makeLead, makeLot } from './inventory-fixtures';

vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

const { GET } = await import('../../src/routes/api/v1/lots/[id]/ledger/+server');

const ADJUSTMENTS = 119;
let lotId = '';
let lead: Awaited<ReturnType<typeof makeLead>>;

beforeAll(async () => {
	seedReferenceLibrary();
	lead = await makeLead();
	lotId = makeLot(lead.actor).id;
	for (let i = 0; i < ADJUSTMENTS; i++)
		adjustLot({ ...lead.actor, address: null }, lotId, {
			direction: 'remove',
			amount: 1,
			unit: 'mg',
			reason: `count ${i}`
		});
});

/** Independent order: every entry sorted here by time, then id (entries of one millisecond), newest first. */
function newestFirstIds(lot: string): string[] {
	return [...ledgerOf(lot)]
		.sort((a, b) => b.at.getTime() - a.at.getTime() || (a.id < b.id ? 1 : -1))
		.map((e) => e.id);
}

async function ledgerPage(lot: string, query = '') {
	const response = await callJson(GET, 'GET', `/api/v1/lots/${lot}/ledger${query}`, undefined, {
		user: lead,
		params: { id: lot }
	});
	return { status: response.status, body: await response.json() };
}

describe('a lot’s ledger, a page at a time', () => {
	it('walks every entry once, newest first, with the honest total', async () => {
		const expected = newestFirstIds(lotId);
		expect(expected).toHaveLength(ADJUSTMENTS + 1);
		const seen: string[] = [];
		let query = '?limit=50';
		for (const size of [50, 50, 20]) {
			const { status, body } = await ledgerPage(lotId, query);
			expect(status).toBe(200);
			expect(body.total).toBe(ADJUSTMENTS + 1);
			expect(body.entries).toHaveLength(size);
			seen.push(...body.entries.map((e: { id: string }) => e.id));
			query = body.earlier ? `?limit=50&before=${body.earlier}` : '';
		}
		expect(query).toBe('');
		expect(seen).toEqual(expected);
	});

	it('pages through many entries of one millisecond, each once', async () => {
		const lot = makeLot(lead.actor);
		const sameMoment = new Date('2026-06-01T08:00:00.000Z');
		const written = Array.from(
			{ length: 7 },
			(_, i) =>
				appendStockEntry(db, {
					lotId: lot.id,
					kind: 'adjustment',
					quantity: -1,
					reason: `same ms ${i}`,
					actorId: lead.id,
					at: sameMoment
				}).id
		);
		const seen: string[] = [];
		let query = '?limit=3';
		for (;;) {
			const { body } = await ledgerPage(lot.id, query);
			seen.push(...body.entries.map((e: { id: string }) => e.id));
			if (!body.earlier) break;
			query = `?limit=3&before=${body.earlier}`;
		}
		// The receipt is newest (made now); the seven of one millisecond follow by id, descending.
		expect(seen.slice(1)).toEqual([...written].sort().reverse());
	});

	it('exports the lot’s ledger in time order, read by keyset chunks', () => {
		// Chunks of 50: three reads for 120 entries, each after the last one's (time, id).
		const text = csvText(ledgerExport(lotId), 50);
		const rows = Papa.parse<Record<string, string>>(text.slice(text.indexOf('\n') + 1), {
			header: true,
			skipEmptyLines: true
		}).data;
		const expected = [...ledgerOf(lotId)]
			.sort((a, b) => a.at.getTime() - b.at.getTime() || (a.id < b.id ? -1 : 1))
			.map((e) => e.reason);
		expect(rows.map((r) => r.reason)).toEqual(expected);
		expect(rows[0].kind).toBe('receipt');
		expect(rows.find((r) => r.reason === 'count 0')).toMatchObject({
			quantity: '-1',
			base_unit: 'mg',
			component: 'Sodium chloride'
		});
	});

	it('gives the lot view the latest 50 and the cursor to the rest', () => {
		const view = lotView(lotId);
		expect(view.ledger).toHaveLength(50);
		expect(view.ledgerTotal).toBe(ADJUSTMENTS + 1);
		expect(view.ledger.map((e) => e.id)).toEqual(newestFirstIds(lotId).slice(0, 50));
		expect(view.ledgerEarlier).not.toBeNull();
		// The on-hand is still the whole ledger's sum: 100 g received, 119 mg taken.
		expect(view.onHand).toBe(100_000 - ADJUSTMENTS);
	});

	it('refuses a made-up cursor and a page too large, naming the parameter', async () => {
		for (const [query, parameter] of [
			['?before=not-a-cursor', 'before'],
			['?limit=201', 'limit'],
			['?limit=0', 'limit']
		]) {
			const { status, body } = await ledgerPage(lotId, query);
			expect(status).toBe(400);
			expect(body.errors.map((e: { path: string }) => e.path)).toEqual([parameter]);
		}
	});

	it('answers 404 for a lot that does not exist', async () => {
		expect((await ledgerPage('no-such-lot')).status).toBe(404);
	});
});
