// The trail for scripts: the trail page's filter, a keyset cursor that walks every matching entry
// exactly once in the order asked, an honest total, and bad parameters refused by name.
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { allAuditEvents, recordAudit } from '$lib/server/audit';
import { callJson } from './endpoint-call';
import { makeUser } from './helpers';

vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

const { GET } = await import('../../src/routes/api/v1/audit/+server');

const WRITTEN = 120;
let admin: { id: string; email: string; name: string; roles: string[] };
let engineer: typeof admin;

beforeAll(async () => {
	const a = await makeUser(['admin']);
	admin = { id: a.id, email: a.email, name: 'Admin', roles: ['admin'] };
	const e = await makeUser(['engineer']);
	engineer = { id: e.id, email: e.email, name: 'Engineer', roles: ['engineer'] };
	for (let i = 0; i < WRITTEN; i++)
		recordAudit(
			{ id: null, email: null },
			{ action: 'test.api_walk', detail: { from: i, to: i + 1 } }
		);
});

async function trail(query: string, user: typeof admin = admin) {
	const response = await callJson(GET, 'GET', `/api/v1/audit${query}`, undefined, { user });
	return { status: response.status, body: await response.json() };
}

describe('GET /api/v1/audit', () => {
	for (const order of ['newest', 'oldest'] as const) {
		it(`walks every matching entry once, ${order} first, with the honest total`, async () => {
			// Independent order: the whole filtered trail as the export reads it.
			const expected = allAuditEvents({ action: 'test.api_walk', order }).map((e) => e.id);
			expect(expected).toHaveLength(WRITTEN);
			const seen: string[] = [];
			let query = `?action=test.api_walk&order=${order}&limit=50`;
			for (const size of [50, 50, 20]) {
				const { status, body } = await trail(query);
				expect(status).toBe(200);
				expect(body.total).toBe(WRITTEN);
				expect(body.entries).toHaveLength(size);
				seen.push(...body.entries.map((e: { id: string }) => e.id));
				query = body.next ? `?action=test.api_walk&order=${order}&limit=50&after=${body.next}` : '';
			}
			expect(query).toBe('');
			expect(seen).toEqual(expected);
		});
	}

	it('reads each entry as the trail page does', async () => {
		const { body } = await trail('?action=test.api_walk&order=oldest&limit=1');
		expect(body.entries[0]).toMatchObject({
			action: 'test.api_walk',
			detail: { from: 0, to: 1 },
			actorEmail: null
		});
		expect(typeof body.entries[0].sentence).toBe('string');
	});

	it('refuses what it cannot read, naming the parameter', async () => {
		for (const [query, parameter] of [
			['?from=yesterday', 'from'],
			['?from=2026-05-02&to=2026-05-01', 'from'],
			['?subject=lot', 'subject'],
			['?after=made-up', 'after'],
			['?limit=500', 'limit'],
			['?order=sideways', 'order']
		]) {
			const { status, body } = await trail(query);
			expect(status, query).toBe(400);
			expect(body.errors.map((e: { path: string }) => e.path)).toEqual([parameter]);
		}
	});

	it('is for those who may read the trail', async () => {
		expect((await trail('', engineer)).status).toBe(403);
	});
});
