// A lot's ledger a page at a time: newest first by keyset, every entry exactly once across the
// pages, the lot view carrying only the latest page, and bad paging refused with a 400.
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { adjustLot } from '$lib/server/inventory/lots';
import { ledgerOf } from '$lib/server/inventory/ledger';
import { lotView } from '$lib/server/inventory/view';
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

async function ledgerPage(lot: string, query = '') {
	const response = await callJson(GET, 'GET', `/api/v1/lots/${lot}/ledger${query}`, undefined, {
		user: lead,
		params: { id: lot }
	});
	return { status: response.status, body: await response.json() };
}

describe('a lot’s ledger, a page at a time', () => {
	it('walks every entry once, newest first, with the honest total', async () => {
		// Independent order: the whole ledger as stored, oldest first, reversed.
		const expected = ledgerOf(lotId)
			.map((e) => e.id)
			.reverse();
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

	it('gives the lot view the latest 50 and the cursor to the rest', () => {
		const view = lotView(lotId);
		expect(view.ledger).toHaveLength(50);
		expect(view.ledgerTotal).toBe(ADJUSTMENTS + 1);
		expect(view.ledger[0].reason).toBe(`count ${ADJUSTMENTS - 1}`);
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
