import type { RequestHandler } from '@sveltejs/kit';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { and, eq, isNotNull } from 'drizzle-orm';
import type { z } from 'zod';
import { allOperations } from '$lib/server/api/openapi';
import { db } from '$lib/server/db';
import {
	batch,
	batchLine,
	organismProfile,
	recipe,
	recipeVersion,
	study,
	vessel
} from '$lib/server/db/schema';
import { saveScenario } from '$lib/server/scenarios';
import { createRun, setRunState } from '$lib/server/runs/run-store';
import { callJson, enterEvent } from './endpoint-call';
import { callRoute } from './api-write-calls';
import { studyRecord } from '$lib/server/studies/study-api';
import { makeUser } from './helpers';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

// The endpoints' guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

/*
 * Every operation whose OpenAPI description has a response schema is called here through its real
 * route handler (real SQLite with the demo seeded), and its answer is parsed with that schema: a
 * field the handler renames, drops or adds fails the test.
 */

type Route = Record<string, RequestHandler>;
const routeModules = import.meta.glob<Route>('../../src/routes/api/v1/**/+server.ts');
const route = (path: string): Promise<Route> =>
	routeModules[`../../src/routes${path}/+server.ts`]();

/** The paths at which `raw` has a key that `kept` (the schema's parse of it) dropped as undescribed. */
function droppedKeys(raw: unknown, kept: unknown, path = ''): string[] {
	if (Array.isArray(raw) && Array.isArray(kept))
		return raw.flatMap((item, i) => droppedKeys(item, kept[i], `${path}${i}.`));
	if (raw === null || kept === null || typeof raw !== 'object' || typeof kept !== 'object')
		return [];
	return Object.entries(raw).flatMap(([key, value]) =>
		key in kept
			? droppedKeys(value, (kept as Record<string, unknown>)[key], `${path}${key}.`)
			: [`${path}${key}: not in the schema`]
	);
}

/** What does not fit: the schema's issues, then the fields it does not describe. */
function shapeProblems(schema: z.ZodType, body: unknown): string[] {
	const parsed = schema.safeParse(body);
	if (!parsed.success)
		return parsed.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
	return droppedKeys(body, parsed.data);
}

const password = 'correct-horse-battery-42';
let scientist: Awaited<ReturnType<typeof makeUser>>;
let user: { id: string; email: string; name: string; roles: string[] };
let scenarioId: string;
let studyId: string;
let recipeId: string;
let approvedN: string;
let approvedVersionId: string;
let lotId: string;
let batchId: string;
let runId: string;
let profileId: string;
let vesselId: string;
let demoRunId: string;

// A feed for the demo bacterium study that needs two feeds (calcium apart from phosphate).
const feedRequest = {
	componentIds: [
		'd-glucose',
		'ammonium-sulfate',
		'calcium-chloride',
		'iron-ii-sulfate',
		'sodium-dihydrogen-phosphate',
		'magnesium-sulfate'
	],
	feedVolumeL: 30,
	temperatureC: 25
};

const batchRun = {
	mode: 'batch',
	kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5 },
	initial: { biomassGPerL: 0.05, substrateGPerL: 10, volumeL: 1 },
	endH: 14,
	outputEveryH: 0.5
};

const fedBatchWithOxygen = {
	mode: 'fedBatch',
	kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5, yieldXO2: 1 },
	initial: { biomassGPerL: 0.5, substrateGPerL: 1, volumeL: 1 },
	feeds: [
		{ label: 'Glucose', strategy: 'constant', substrateGPerL: 300, rateLPerH: 0.02 },
		{ label: 'Amino acids', strategy: 'constant', substrateGPerL: 0, rateLPerH: 0.01, startH: 4 }
	],
	oxygen: { kLaPerH: 200, saturationMgPerL: 7 },
	maxVolumeL: 1.3,
	endH: 10,
	outputEveryH: 0.5
};

const post = (path: string, body: unknown) => async () =>
	callJson((await route(path)).POST, 'post', path, body, { user });
const get =
	(path: string, params: Record<string, string> = {}) =>
	async () => {
		const concrete = Object.entries(params).reduce(
			(p, [key, value]) => p.replace(`[${key}]`, value),
			path
		);
		return callJson((await route(path)).GET, 'get', concrete, undefined, { user, params });
	};

// Library records written through the API: a fresh name each call, as names are unique.
const fresh = (what: string) => `Shapes ${what} ${crypto.randomUUID().slice(0, 8)}`;
const newComponent = (name = fresh('salt')) => ({ name, category: 'salt', formula: 'CsCl' });
const newProfile = (name = fresh('bacterium')) => ({
	name,
	group: 'bacterium',
	kind: 'elementalFractions',
	presetId: 'bacterium-neidhardt-1990',
	carbonSourceId: 'd-glucose',
	yieldXSGPerG: 0.5,
	element: { Fe: { role: 'required' } }
});
const newVessel = (name = fresh('tank')) => ({
	name,
	minWorkingVolumeL: 1,
	maxWorkingVolumeL: 10,
	kLaMode: 'entered',
	kLaPerH: 150,
	maxGasFlowVvm: 1,
	maxPressureKPa: 200,
	temperatureC: 30,
	coolingCapacityW: 500,
	impellerCount: 1
});

/** Creates a record with POST, then replaces it with PUT at the ETag the creation gave. */
const createThenPut =
	(path: string, body: (name?: string) => Record<string, unknown>) => async () => {
		const created = await (await post(path, body())()).json();
		const request = new Request(new URL(`${path}/${created.id}`, 'http://127.0.0.1'), {
			method: 'PUT',
			headers: { 'content-type': 'application/json', 'if-match': '"1"' },
			body: JSON.stringify(body(created.name))
		});
		const handler = (await route(`${path}/[id]`)).PUT;
		return handler(enterEvent(request, { user, params: { id: created.id } }));
	};

/** One real call per documented response, keyed `method path` as in the OpenAPI document. */
const calls: Record<string, () => Promise<Response>> = {
	'get /api/v1/health': get('/api/v1/health'),
	'get /api/v1/me': get('/api/v1/me'),
	'get /api/v1/openapi.json': get('/api/v1/openapi.json'),
	'post /api/v1/session': async () =>
		callJson(
			(await route('/api/v1/session')).POST,
			'post',
			'/api/v1/session',
			{ email: scientist.email, password },
			{ user: null }
		),
	'post /api/v1/formula': post('/api/v1/formula', { formula: 'MgSO4·7H2O' }),
	'post /api/v1/oxygen/saturation': post('/api/v1/oxygen/saturation', {
		temperatureC: 37,
		salinityGPerKg: 5
	}),
	'post /api/v1/sufficiency': post('/api/v1/sufficiency', {
		profile: { kind: 'preset', id: 'bacterium-neidhardt-1990' },
		target: { biomassGPerL: 1.5 },
		supply: {
			sources: [
				{
					name: 'M9',
					elementsGPerL: { N: 0.26, P: 2.2, Mg: 0.05 },
					componentsGPerL: { glucose: 4 }
				}
			]
		},
		carbon: { basis: 'component', component: 'glucose', yieldGPerG: 0.5 }
	}),
	'post /api/v1/recipes/preview': post('/api/v1/recipes/preview', {
		preparationTemperatureC: 25,
		osmolalityMinMOsmPerKg: 250,
		osmolalityMaxMOsmPerKg: 350,
		lines: [
			{ componentId: 'sodium-chloride', amount: 5, unit: 'g/L' },
			{ componentId: 'd-glucose', amount: 10, unit: 'g/L' }
		]
	}),
	'post /api/v1/simulate': post('/api/v1/simulate', fedBatchWithOxygen),
	'post /api/v1/chemostat/steady-state': post('/api/v1/chemostat/steady-state', {
		muMaxPerH: 0.6,
		ksGPerL: 0.05,
		yieldXS: 0.5,
		feedSubstrateGPerL: 20,
		dilutionPerH: 0.4,
		safetyMargin: 0.1
	}),
	'post /api/v1/productivity/batch-vs-continuous': post(
		'/api/v1/productivity/batch-vs-continuous',
		{
			muMaxPerH: 0.6,
			ksGPerL: 0.05,
			yieldXS: 0.5,
			substrateGPerL: 20,
			inoculumGPerL: 0.1,
			dilutionPerH: 0.4,
			turnaround: { cleaningH: 2, sterilisingH: 1, fillingH: 1, lagH: 1 }
		}
	),
	'post /api/v1/fit/growth': async () => {
		// Run data from the simulator, with a small fixed ripple so the fit sees measurement noise.
		const run = await (await post('/api/v1/simulate', batchRun)()).json();
		const ripple = (values: number[]) => values.map((v, i) => v * (1 + 0.01 * Math.sin(7 * i)));
		return post('/api/v1/fit/growth', {
			timeH: run.t,
			biomassGPerL: ripple(run.biomassGPerL),
			substrateGPerL: ripple(run.substrateGPerL)
		})();
	},
	'get /api/v1/scenarios': get('/api/v1/scenarios'),
	'post /api/v1/scenarios': post('/api/v1/scenarios', {
		name: 'Shapes: fed-batch with oxygen',
		request: fedBatchWithOxygen
	}),
	'get /api/v1/scenarios/{id}': async () => get('/api/v1/scenarios/[id]', { id: scenarioId })(),
	'patch /api/v1/scenarios/{id}': async () =>
		callJson(
			(await route('/api/v1/scenarios/[id]')).PATCH,
			'patch',
			`/api/v1/scenarios/${scenarioId}`,
			{ notes: 'renamed by the shapes test' },
			{ user, params: { id: scenarioId } }
		),
	'post /api/v1/studies/evaluate': async () => post('/api/v1/studies/evaluate', { studyId })(),
	'post /api/v1/stoichiometry': post('/api/v1/stoichiometry', {
		species: [
			{ id: 'glucose', formula: 'C6H12O6' },
			{ id: 'ammonia', formula: 'NH3' },
			{ id: 'oxygen', formula: 'O2' },
			{ id: 'biomass', formula: 'CH1.8O0.5N0.2', ashFraction: 0.05, role: 'biomass' },
			{ id: 'co2', formula: 'CO2' },
			{ id: 'water', formula: 'H2O' }
		],
		specifications: [
			{ kind: 'rate', species: 'glucose', mol: -1 },
			{ kind: 'massYield', product: 'biomass', substrate: 'glucose', gPerG: 0.5 },
			{ kind: 'molarRatio', numerator: 'co2', denominator: 'oxygen', value: 1.05 }
		]
	}),
	'get /api/v1/recipes': async () => get('/api/v1/recipes')(),
	'get /api/v1/recipes/{id}': async () => get('/api/v1/recipes/[id]', { id: recipeId })(),
	'get /api/v1/recipes/{id}/versions/{n}': async () =>
		get('/api/v1/recipes/[id]/versions/[n]', { id: recipeId, n: approvedN })(),
	'get /api/v1/components': get('/api/v1/components'),
	'post /api/v1/components': async () => post('/api/v1/components', newComponent())(),
	'get /api/v1/components/{id}': get('/api/v1/components/[id]', { id: 'sodium-chloride' }),
	'put /api/v1/components/{id}': createThenPut('/api/v1/components', newComponent),
	'get /api/v1/profiles': get('/api/v1/profiles'),
	'post /api/v1/profiles': async () => post('/api/v1/profiles', newProfile())(),
	'get /api/v1/profiles/{id}': async () => get('/api/v1/profiles/[id]', { id: profileId })(),
	'put /api/v1/profiles/{id}': createThenPut('/api/v1/profiles', newProfile),
	'get /api/v1/vessels': get('/api/v1/vessels'),
	'post /api/v1/vessels': async () => post('/api/v1/vessels', newVessel())(),
	'get /api/v1/vessels/{id}': async () => get('/api/v1/vessels/[id]', { id: vesselId })(),
	'put /api/v1/vessels/{id}': createThenPut('/api/v1/vessels', newVessel),
	'get /api/v1/lots': get('/api/v1/lots'),
	'post /api/v1/lots': post('/api/v1/lots', {
		component: 'd-glucose',
		supplier: 'Shapes Supply',
		supplierLot: `SH-${crypto.randomUUID().slice(0, 8)}`,
		quantity: '500',
		unit: 'g',
		receivedOn: '2026-01-05',
		expiresOn: '2028-01-05'
	}),
	'get /api/v1/lots/{id}': async () => get('/api/v1/lots/[id]', { id: lotId })(),
	'get /api/v1/audit': async () =>
		callJson((await route('/api/v1/audit')).GET, 'get', '/api/v1/audit?limit=5', undefined, {
			user: { ...user, roles: ['admin'] }
		}),
	'get /api/v1/lots/{id}/ledger': async () => get('/api/v1/lots/[id]/ledger', { id: lotId })(),
	'get /api/v1/batches': get('/api/v1/batches'),
	'post /api/v1/batches': async () =>
		post('/api/v1/batches', {
			versionId: approvedVersionId,
			targetVolumeL: 2,
			plannedOn: '2026-12-20',
			intendedUse: 'Shapes check'
		})(),
	'get /api/v1/batches/{id}': async () => get('/api/v1/batches/[id]', { id: batchId })(),
	'get /api/v1/studies': get('/api/v1/studies'),
	'post /api/v1/studies/{id}/feed-design': async () =>
		callJson(
			(await route('/api/v1/studies/[id]/feed-design')).POST,
			'post',
			`/api/v1/studies/${studyId}/feed-design`,
			feedRequest,
			{ user, params: { id: studyId } }
		),
	'post /api/v1/studies/{id}/feed-design/drafts': async () =>
		callJson(
			(await route('/api/v1/studies/[id]/feed-design/drafts')).POST,
			'post',
			`/api/v1/studies/${studyId}/feed-design/drafts`,
			{ ...feedRequest, names: [`Shapes feed A ${++draftRound}`, `Shapes feed B ${draftRound}`] },
			{ user, params: { id: studyId } }
		),
	'get /api/v1/runs': get('/api/v1/runs'),
	'post /api/v1/runs/{id}/data': async () =>
		callJson(
			(await route('/api/v1/runs/[id]/data')).POST,
			'post',
			`/api/v1/runs/${runId}/data`,
			// a new time each call, so the check can run again without a clash
			{ points: [{ time_s: ++dataRound * 60, do_percent: 80, ph: 7 }] },
			{ user, params: { id: runId } }
		),
	...writeCalls(),
	// The demo run with the most data, so the rows and the analysis's parts are filled.
	'get /api/v1/runs/{id}/data': async () => get('/api/v1/runs/[id]/data', { id: demoRunId })(),
	'get /api/v1/runs/{id}/analysis': async () =>
		get('/api/v1/runs/[id]/analysis', { id: demoRunId })()
};
let draftRound = 0;
let dataRound = 0;

/** The writes for recipe drafts, studies and runs: each call makes the record it changes. */
function writeCalls(): Record<string, () => Promise<Response>> {
	let round = 0;
	const newDraft = () =>
		callRoute('POST', '/api/v1/recipes', {
			user,
			body: {
				name: `Shapes recipe ${++round} ${crypto.randomUUID().slice(0, 6)}`,
				kind: 'basal',
				lines: [{ componentId: 'sodium-chloride', amount: 5, unit: 'g/L' }]
			}
		});
	const onNewDraft = async (method: 'PUT' | 'POST', path: string, body?: unknown) => {
		const created = await newDraft();
		const { recipe: made } = (await created.json()) as { recipe: { id: string } };
		return callRoute(method, `/api/v1/recipes/[id]/versions/[n]${path}`, {
			user,
			params: { id: made.id, n: '1' },
			ifMatch: created.headers.get('etag')!,
			body
		});
	};
	const newRun = () =>
		createRun(
			{ id: user.id, email: user.email },
			{
				name: `Shapes run ${++round}`,
				studyId,
				vesselId: '',
				profileId: '',
				startedAt: '2026-12-01T08:00',
				gasReferenceTemperatureC: 0,
				gasReferencePressureKPa: 101.325,
				people: '',
				notes: ''
			}
		).id;
	const studyBody = () => {
		const {
			id: _id,
			createdById: _c,
			createdByName: _n,
			revision: _r,
			...rest
		} = studyRecord(studyId);
		const { createdAt: _a, updatedAt: _u, ...body } = rest;
		return body;
	};
	return {
		'post /api/v1/recipes': newDraft,
		'put /api/v1/recipes/{id}/versions/{n}': () => onNewDraft('PUT', '', { targetPh: 7.1 }),
		'put /api/v1/recipes/{id}/versions/{n}/lines': () =>
			onNewDraft('PUT', '/lines', {
				lines: [{ componentId: 'd-glucose', amount: 10, unit: 'g/L' }]
			}),
		'post /api/v1/recipes/{id}/versions/{n}/submit': () => onNewDraft('POST', '/submit'),
		'post /api/v1/recipes/{id}/drafts': () =>
			callRoute('POST', '/api/v1/recipes/[id]/drafts', {
				user,
				params: { id: recipeId },
				body: { fromVersion: Number(approvedN) }
			}),
		'post /api/v1/studies': () =>
			callRoute('POST', '/api/v1/studies', {
				user,
				body: { ...studyBody(), name: `Shapes study ${++round}` }
			}),
		'get /api/v1/studies/{id}': () =>
			callRoute('GET', '/api/v1/studies/[id]', { user, params: { id: studyId } }),
		'put /api/v1/studies/{id}': () =>
			callRoute('PUT', '/api/v1/studies/[id]', {
				user,
				params: { id: studyId },
				ifMatch: `"${studyRecord(studyId).revision}"`,
				body: { notes: `Shapes note ${++round}` }
			}),
		'post /api/v1/runs': () =>
			callRoute('POST', '/api/v1/runs', {
				user,
				body: { name: `Shapes run ${++round}`, studyId, startedAt: '2026-12-02T08:00' }
			}),
		'get /api/v1/runs/{id}': () =>
			callRoute('GET', '/api/v1/runs/[id]', { user, params: { id: runId } }),
		'post /api/v1/runs/{id}/close': () =>
			callRoute('POST', '/api/v1/runs/[id]/close', {
				user,
				params: { id: newRun() },
				ifMatch: '"1"'
			}),
		'post /api/v1/runs/{id}/reopen': () => {
			const id = newRun();
			setRunState({ id: user.id, email: user.email }, id, 'closed', '');
			return callRoute('POST', '/api/v1/runs/[id]/reopen', {
				user,
				params: { id },
				ifMatch: '"2"',
				body: { reason: 'More data came in' }
			});
		},
		'post /api/v1/runs/{id}/batches': async () => {
			const released = db.select().from(batch).where(eq(batch.id, batchId)).get()!;
			return callRoute('POST', '/api/v1/runs/[id]/batches', {
				user,
				params: { id: newRun() },
				body: { batchNumber: released.number, role: 'medium' }
			});
		}
	};
}

const documented = allOperations().filter((op) => op.response !== undefined);

/** A fresh real answer of the operation `key`. */
async function answerOf(key: string): Promise<Record<string, unknown>> {
	return (await (await calls[key]()).json()) as Record<string, unknown>;
}

beforeAll(async () => {
	scientist = await makeUser(['engineer', 'media_scientist', 'inventory_lead'], password);
	user = { id: scientist.id, email: scientist.email, name: 'Shapes', roles: scientist.roles };
	scenarioId = saveScenario(
		{ ...user, address: '127.0.0.1' },
		{ name: 'Shapes: batch', request: batchRun as never }
	).id;
	studyId = db
		.select()
		.from(study)
		.where(eq(study.name, 'Bacterium glucose fed-batch, pilot (demo)'))
		.get()!.id;
	const approved = db
		.select()
		.from(recipeVersion)
		.innerJoin(recipe, eq(recipeVersion.recipeId, recipe.id))
		.where(eq(recipeVersion.status, 'approved'))
		.all()
		.find((row) => row.recipe.kind === 'basal')!;
	recipeId = approved.recipe.id;
	approvedN = String(approved.recipe_version.n);
	approvedVersionId = approved.recipe_version.id;
	// A released demo batch and a lot it used, so sheet lines, lots, ledger and where-used are filled.
	batchId = db.select().from(batch).where(eq(batch.state, 'released')).get()!.id;
	lotId = db
		.select()
		.from(batchLine)
		.where(and(eq(batchLine.batchId, batchId), isNotNull(batchLine.lotId)))
		.get()!.lotId!;
	profileId = db.select().from(organismProfile).get()!.id;
	vesselId = db.select().from(vessel).get()!.id;
	// The demo run with the most data.
	demoRunId = (
		db.$client
			.prepare('SELECT run_id FROM run_time GROUP BY run_id ORDER BY count(*) DESC LIMIT 1')
			.get() as { run_id: string }
	).run_id;
	runId = createRun(
		{ id: user.id, email: user.email },
		{
			name: 'Shapes run',
			studyId,
			vesselId: '',
			profileId: '',
			startedAt: '2026-12-01T08:00',
			gasReferenceTemperatureC: 0,
			gasReferencePressureKPa: 101.325,
			people: '',
			notes: ''
		}
	).id;
});

describe('every documented response schema describes a real answer', () => {
	it('has a real call here for each operation the OpenAPI document gives a response schema', () => {
		expect(Object.keys(calls).sort()).toEqual(
			documented.map((op) => `${op.method} ${op.path}`).sort()
		);
	});

	for (const op of documented) {
		const key = `${op.method} ${op.path}`;
		it(`${key} answers ${op.successStatus ?? 200} with what its schema describes`, async () => {
			const response = await calls[key]();
			const body = await response.json();
			expect(response.status, JSON.stringify(body).slice(0, 400)).toBe(op.successStatus ?? 200);
			expect(shapeProblems(op.response!, body)).toEqual([]);
		});
	}
});

describe('the check fails when a real answer and its schema disagree', () => {
	const simulate = () => documented.find((op) => op.path === '/api/v1/simulate')!;

	it('a renamed field, top-level or nested, is missing; a field the schema lacks is undescribed', async () => {
		const body = await answerOf('post /api/v1/simulate');
		expect(shapeProblems(simulate().response!, body)).toEqual([]);
		const { biomassGPerL, ...rest } = body;
		expect(shapeProblems(simulate().response!, { ...rest, biomassGperL: biomassGPerL })).toEqual([
			expect.stringMatching(/^biomassGPerL: /)
		]);
		expect(shapeProblems(simulate().response!, { ...body, biomassGperL: biomassGPerL })).toEqual([
			'biomassGperL: not in the schema'
		]);
		const streams = body.feedStreams as Record<string, unknown>[];
		const { deliveredL, ...stream } = streams[1];
		const renamed = {
			...body,
			feedStreams: [streams[0], { ...stream, deliveredLitres: deliveredL }]
		};
		expect(shapeProblems(simulate().response!, renamed)).toEqual([
			expect.stringMatching(/^feedStreams\.1\.deliveredL: /)
		]);
		const added = {
			...body,
			feedStreams: [streams[0], { ...streams[1], deliveredLitres: deliveredL }]
		};
		expect(shapeProblems(simulate().response!, added)).toEqual([
			'feedStreams.1.deliveredLitres: not in the schema'
		]);
	});

	it('a field of the wrong type fails, and so does a renamed field the partial study schema documents', async () => {
		const body = await answerOf('post /api/v1/simulate');
		expect(
			shapeProblems(simulate().response!, {
				...body,
				events: [{ kind: 'overflow', tH: 1, message: 'x' }]
			})
		).toHaveLength(1);
		const report = await answerOf('post /api/v1/studies/evaluate');
		const { verdict, ...rest } = report;
		const schema = documented.find((op) => op.path === '/api/v1/studies/evaluate')!.response!;
		expect(shapeProblems(schema, { ...rest, outcome: verdict })).toEqual([
			expect.stringMatching(/^verdict: /)
		]);
	});
});
