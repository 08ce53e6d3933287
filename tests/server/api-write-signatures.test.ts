import { count, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { buildOpenApiDocument } from '$lib/server/api/openapi';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { auditEvent, batch, eSignature, lot, recipe, recipeVersion } from '$lib/server/db/schema';
import { callRoute, problemOf } from './api-write-calls';
import { makeUser } from './helpers';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

// The endpoints' guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

type Person = Awaited<ReturnType<typeof makeUser>> & { name: string };
let scientist: Person;
let lead: Person;
let technician: Person;

beforeAll(async () => {
	scientist = { ...(await makeUser(['media_scientist'])), name: 'API scientist' };
	lead = { ...(await makeUser(['inventory_lead'])), name: 'API lead' };
	technician = { ...(await makeUser(['prep_technician'])), name: 'API technician' };
});

/** Everything a signature would change: the signatures, the trail and the records' states. */
function recordsNow() {
	return {
		signatures: db.select({ n: count() }).from(eSignature).get()!.n,
		trail: db.select({ n: count() }).from(auditEvent).get()!.n,
		versions: db
			.select({ id: recipeVersion.id, status: recipeVersion.status })
			.from(recipeVersion)
			.all(),
		lots: db.select({ id: lot.id, status: lot.status }).from(lot).all(),
		batches: db.select({ id: batch.id, state: batch.state }).from(batch).all()
	};
}

function demoVersion() {
	const row = db
		.select({ recipeId: recipe.id, n: recipeVersion.n })
		.from(recipeVersion)
		.innerJoin(recipe, eq(recipeVersion.recipeId, recipe.id))
		.get()!;
	return { id: row.recipeId, n: String(row.n) };
}

interface Case {
	route: string;
	params: () => Record<string, string>;
	page: (params: Record<string, string>) => string;
	doing: string;
	allowed: () => Person;
	unknown: () => Record<string, string>;
}

const CASES: Case[] = [
	{
		route: '/api/v1/recipes/[id]/versions/[n]/review',
		params: demoVersion,
		page: (p) => `/recipes/${p.id}/versions/${p.n}`,
		doing: 'Reviewing',
		allowed: () => scientist,
		unknown: () => ({ id: 'no-such-recipe', n: '1' })
	},
	{
		route: '/api/v1/recipes/[id]/versions/[n]/approve',
		params: demoVersion,
		page: (p) => `/recipes/${p.id}/versions/${p.n}`,
		doing: 'Approving',
		allowed: () => scientist,
		unknown: () => ({ ...demoVersion(), n: '99' })
	},
	{
		route: '/api/v1/lots/[id]/release',
		params: () => ({ id: db.select().from(lot).get()!.id }),
		page: (p) => `/lots/${p.id}`,
		doing: 'Releasing a lot',
		allowed: () => lead,
		unknown: () => ({ id: 'no-such-lot' })
	},
	{
		route: '/api/v1/lots/[id]/reject',
		params: () => ({ id: db.select().from(lot).get()!.id }),
		page: (p) => `/lots/${p.id}`,
		doing: 'Rejecting a lot',
		allowed: () => lead,
		unknown: () => ({ id: 'no-such-lot' })
	},
	{
		route: '/api/v1/batches/[id]/review',
		params: () => ({ id: db.select().from(batch).get()!.id }),
		page: (p) => `/batches/${p.id}`,
		doing: 'Reviewing a batch',
		allowed: () => scientist,
		unknown: () => ({ id: 'no-such-batch' })
	}
];

describe('acts that need an electronic signature are never done through the API', () => {
	for (const c of CASES) {
		it(`POST ${c.route}: 403 signature-required with the page where it is signed; nothing changes`, async () => {
			const params = c.params();
			const before = recordsNow();
			const response = await callRoute('POST', c.route, { user: c.allowed(), params });
			expect(response.status).toBe(403);
			const problem = await problemOf(response);
			const signAt = `${config.origin}${c.page(params)}`;
			expect(problem).toMatchObject({
				type: 'urn:brothwright:problem:signature-required',
				status: 403,
				signAt,
				detail: `${c.doing} needs your signature with your password in the app: open ${signAt}`
			});
			expect(new URL(problem.signAt!).pathname).toBe(c.page(params));
			expect(recordsNow()).toEqual(before);
		});

		it(`POST ${c.route}: 404 for an unknown id, a plain 403 for a role without the act`, async () => {
			const unknown = await callRoute('POST', c.route, { user: c.allowed(), params: c.unknown() });
			expect(unknown.status).toBe(404);
			const refused = await problemOf(
				await callRoute('POST', c.route, { user: technician, params: c.params() })
			);
			expect(refused.status).toBe(403);
			expect(refused.type).toBe('urn:brothwright:problem:forbidden');
			expect(refused.signAt).toBeUndefined();
			const nobody = await callRoute('POST', c.route, { user: null, params: c.params() });
			expect(nobody.status).toBe(401);
		});
	}

	it('documents the answer once, as the Problem403 example, and in each operation', () => {
		const doc = buildOpenApiDocument('http://localhost') as unknown as {
			paths: Record<string, { post: { summary: string; responses: Record<string, unknown> } }>;
			components: {
				responses: Record<string, { content: Record<string, { examples?: object }> }>;
			};
		};
		const example = doc.components.responses.Problem403.content['application/problem+json']
			.examples as Record<string, { value: { type: string; signAt: string } }>;
		expect(example['signature-required'].value.type).toBe(
			'urn:brothwright:problem:signature-required'
		);
		for (const c of CASES) {
			const path = c.route.replace(/\[(\w+)\]/g, '{$1}');
			const operation = doc.paths[path].post;
			expect(operation.summary).toContain('urn:brothwright:problem:signature-required');
			expect(operation.responses['403']).toEqual({ $ref: '#/components/responses/Problem403' });
		}
	});
});
