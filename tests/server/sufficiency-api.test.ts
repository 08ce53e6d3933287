import type { RequestEvent, RequestHandler } from '@sveltejs/kit';
import { describe, expect, it, vi } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { study } from '$lib/server/db/schema';
import { sufficiencyLineResponse, sufficiencyResponse } from '$chemistry';
import { evaluateResponse } from '$lib/server/api/operations/studies';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

// The endpoints' guard reads the request through getRequestEvent, which only the SvelteKit server
// sets; this test hands it the event it builds, as strict-requests.test.ts does.
const current = vi.hoisted(() => ({ event: null as unknown }));
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: () => current.event
}));

const engineer = { id: 'u-api', email: 'api@lab.test', name: 'Api', roles: ['engineer'] };

async function post(
	handler: { POST: RequestHandler },
	path: string,
	body: unknown
): Promise<Response> {
	const url = new URL(`http://127.0.0.1${path}`);
	const request = new Request(url, {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify(body)
	});
	const event = {
		request,
		url,
		params: {},
		locals: { user: engineer, session: null }
	} as unknown as RequestEvent;
	current.event = event;
	return handler.POST(event);
}

const sufficiency = () => import('../../src/routes/api/v1/sufficiency/+server');
const evaluate = () => import('../../src/routes/api/v1/studies/evaluate/+server');

/** Every key the endpoint answers is one its OpenAPI description names. */
function expectDescribed(body: Record<string, unknown>, shape: Record<string, unknown>) {
	for (const key of Object.keys(body))
		expect(Object.keys(shape), `undescribed field ${key}`).toContain(key);
}

// M9 glucose medium (Sambrook & Russell 2001): N from 1 g/L NH4Cl = 14.007 / 53.489 = 0.26187 g/L; no Fe;
// Ca 0.1 mM × 40.078 = 0.0040078 g/L (IUPAC 2021 atomic weights). Other elements in tests/chemistry/trace-elements.test.ts.
const m9 = {
	profile: { kind: 'preset', id: 'bacterium-neidhardt-1990' },
	target: { biomassGPerL: 1.5 },
	supply: {
		sources: [
			{
				name: 'M9',
				elementsGPerL: {
					N: 0.261867,
					P: 2.16182,
					K: 0.861933,
					Na: 2.39222,
					Cl: 0.97314,
					Mg: 0.04861,
					S: 0.06412,
					Ca: 0.0040078
				},
				componentsGPerL: { glucose: 4 }
			}
		]
	},
	safetyFactor: 1,
	carbon: {
		basis: 'component',
		component: 'glucose',
		yieldGPerG: 0.5,
		confidence: 'from memory',
		source: 'Common practice for E. coli on glucose'
	}
};

describe('POST /api/v1/sufficiency says for every value its role, its confidence and its source', () => {
	it('answers the M9 case with N as the limit at 0.26187 / 0.14 = 1.87 g/L and Fe, Ca as warnings', async () => {
		const response = await post(await sufficiency(), '/api/v1/sufficiency', m9);
		expect(response.status).toBe(200);
		const body = await response.json();
		expect(sufficiencyResponse.safeParse(body).success).toBe(true);
		expectDescribed(body, sufficiencyResponse.shape);
		for (const line of body.lines) expectDescribed(line, sufficiencyLineResponse.shape);
		expect(body.limiting.key).toBe('N');
		// Neidhardt, Ingraham & Schaechter (1990): N 14 % of dry mass (confirmed).
		expect(body.maximumSupportable.biomassGPerL).toBeCloseTo(0.261867 / 0.14, 6);
		const line = (key: string) => body.lines.find((l: { key: string }) => l.key === key);
		expect(line('N')).toMatchObject({
			role: 'required',
			roleFrom: 'default',
			confidence: 'confirmed',
			source: expect.stringMatching(/Neidhardt/)
		});
		expect(line('Fe')).toMatchObject({ role: 'trace', confidence: 'from memory', supplyGPerL: 0 });
		expect(line('glucose')).toMatchObject({
			role: 'required',
			confidence: 'from memory',
			source: 'Common practice for E. coli on glucose'
		});
		expect(body.warnings.map((w: string) => w.split(' ')[0])).toEqual(['Ca', 'Fe']);
		expect(body.defaultRolesBasis).toMatch(/Common practice/);
	});

	it('takes a role and a confidence for an element, and refuses unknown keys in them', async () => {
		const withFe = {
			...m9,
			profile: {
				...m9.profile,
				elements: { Fe: { role: 'required', confidence: 'measured', source: 'our analysis' } }
			}
		};
		const body = await (await post(await sufficiency(), '/api/v1/sufficiency', withFe)).json();
		// Fe now required and absent: the limit, 0 g/L.
		expect(body.limiting.key).toBe('Fe');
		expect(body.maximumSupportable.biomassGPerL).toBe(0);

		const misspelt = { ...m9, profile: { ...m9.profile, elements: { Fe: { rol: 'required' } } } };
		const refused = await post(await sufficiency(), '/api/v1/sufficiency', misspelt);
		expect(refused.status).toBe(400);
		expect((await refused.json()).errors.map((e: { path: string }) => e.path)).toEqual([
			'profile.elements.Fe.rol'
		]);
		const badRole = await post(await sufficiency(), '/api/v1/sufficiency', {
			...m9,
			profile: { ...m9.profile, elements: { Fe: { role: 'essential' } } }
		});
		expect(badRole.status).toBe(400);
		expect((await badRole.json()).errors[0].path).toBe('profile.elements.Fe.role');
		// A statement on an element the table does not list is the science's refusal, still a 400 naming it.
		const zn = await post(await sufficiency(), '/api/v1/sufficiency', {
			...m9,
			profile: { ...m9.profile, elements: { Zn: { role: 'trace' } } }
		});
		expect(zn.status).toBe(400);
		expect((await zn.json()).errors[0].path).toBe('profile.elements.Zn');
	});
});

describe('POST /api/v1/studies/evaluate carries the same on each nutrient line', () => {
	it('answers the demo bacterium study with roles and confidences, trace shortfalls among the warnings', async () => {
		const id = db
			.select()
			.from(study)
			.where(eq(study.name, 'Bacterium glucose fed-batch, pilot (demo)'))
			.get()!.id;
		const response = await post(await evaluate(), '/api/v1/studies/evaluate', { studyId: id });
		expect(response.status).toBe(200);
		const body = await response.json();
		const parsed = evaluateResponse.safeParse(body);
		expect(parsed.success, JSON.stringify(parsed.error?.issues.slice(0, 3))).toBe(true);
		for (const line of body.nutrients.lines)
			expectDescribed(line, {
				...sufficiencyLineResponse.shape,
				name: 1,
				runout: 1,
				noRunout: 1
			});
		const fe = body.nutrients.lines.find((l: { key: string }) => l.key === 'Fe');
		expect(fe).toMatchObject({ role: 'trace', confidence: 'from memory', sufficient: false });
		expect(body.limit.key).toBe('N');
		expect(body.warnings.some((w: string) => w.startsWith('Fe covers'))).toBe(true);
		expect(body.reasons.some((r: string) => r.startsWith('Fe') || r.includes(' Fe '))).toBe(false);
	});
});
