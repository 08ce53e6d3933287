import type { RequestHandler } from '@sveltejs/kit';
import Papa from 'papaparse';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { study } from '$lib/server/db/schema';
import { createRun } from '$lib/server/runs/run-store';
import { readSeries } from '$lib/server/runs/series-read';
import { callJson, enterEvent } from './endpoint-call';
import { makeUser } from './helpers';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

// The endpoints' guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

type Route = Record<string, RequestHandler>;
const routeModules = import.meta.glob<Route>('../../src/routes/api/v1/**/+server.ts');
const route = (path: string): Promise<Route> =>
	routeModules[`../../src/routes${path}/+server.ts`]();

type Person = { id: string; email: string; name: string; roles: string[] };
let engineer: Person;
let prepTechnician: Person;
let studyId: string;
const STUDY_NAME = 'Yeast glycerol fed-batch, bench (demo)';

async function person(roles: Parameters<typeof makeUser>[0], name: string): Promise<Person> {
	const made = await makeUser(roles);
	return { id: made.id, email: made.email, name, roles: made.roles };
}

function newRun(name: string): { id: string; number: string } {
	return createRun(
		{ id: engineer.id, email: engineer.email },
		{
			name,
			studyId,
			vesselId: '',
			profileId: '',
			startedAt: '2026-12-01T08:00',
			gasReferenceTemperatureC: 0,
			gasReferencePressureKPa: 101.325,
			people: '',
			notes: ''
		}
	);
}

const dataPath = (runId: string) => `/api/v1/runs/${runId}/data`;

async function postPoints(runId: string, body: unknown, user: Person = engineer) {
	const handler = (await route('/api/v1/runs/[id]/data')).POST;
	return callJson(handler, 'post', dataPath(runId), body, { user, params: { id: runId } });
}

/** A body of another type than JSON, built by hand as a client would send it. */
async function postText(runId: string, text: string, contentType: string, query = '') {
	const handler = (await route('/api/v1/runs/[id]/data')).POST;
	const request = new Request(new URL(`${dataPath(runId)}${query}`, 'http://127.0.0.1'), {
		method: 'POST',
		headers: { 'content-type': contentType },
		body: text
	});
	return handler(enterEvent(request, { user: engineer, params: { id: runId } }));
}

async function getFrom(path: string, concrete: string, params: Record<string, string> = {}) {
	const handler = (await route(path)).GET;
	return callJson(handler, 'get', concrete, undefined, { user: engineer, params });
}

beforeAll(async () => {
	engineer = await person(['engineer'], 'Runs engineer');
	prepTechnician = await person(['prep_technician'], 'Runs prep');
	studyId = db.select().from(study).where(eq(study.name, STUDY_NAME)).get()!.id;
});

describe('POST /api/v1/runs/{id}/data', () => {
	let runId: string;
	/** what the run should hold: seconds → signal → value, kept beside every accepted request */
	const expected = new Map<number, Record<string, number>>();
	const remember = (timeS: number, signal: string, value: number) =>
		expected.set(timeS, { ...expected.get(timeS), [signal]: value });
	const storedDo = () => {
		const s = readSeries(runId).do_percent!;
		return Object.fromEntries(s.timeS.map((t, i) => [t, s.value[i]]));
	};

	const first = [
		{ time_h: 0, do_percent: 90 },
		{ time_h: 0.5, do_percent: 80 },
		{ time_h: 1, do_percent: 70 }
	];

	beforeAll(() => {
		runId = newRun('API data run').id;
	});

	it('stores JSON points: 201 with the count inserted', async () => {
		const response = await postPoints(runId, { points: first });
		expect(response.status).toBe(201);
		expect(await response.json()).toMatchObject({
			inserted: first.length,
			unchanged: 0,
			replaced: 0,
			signals: ['do_percent']
		});
		for (const p of first) remember(p.time_h * 3600, 'do_percent', p.do_percent);
		expect(storedDo()).toEqual({ 0: 90, 1800: 80, 3600: 70 });
	});

	it('leaves the same points sent again as they are: 201, inserted 0, unchanged N', async () => {
		const response = await postPoints(runId, { points: first });
		expect(response.status).toBe(201);
		expect(await response.json()).toMatchObject({
			inserted: 0,
			unchanged: first.length,
			replaced: 0
		});
	});

	it('refuses another value at a stored time with 409, naming the signal and time, storing nothing', async () => {
		const response = await postPoints(runId, {
			points: [
				{ time_h: 0.5, do_percent: 75 },
				{ time_h: 2, do_percent: 60 }
			]
		});
		expect(response.status).toBe(409);
		expect(response.headers.get('content-type')).toContain('application/problem+json');
		const problem = await response.json();
		expect(problem.status).toBe(409);
		expect(problem.detail).toContain('DO (% of air saturation) at 0.5 h');
		expect(problem.detail).toContain('stored 80, sent 75');
		// neither the clash nor the new point beside it was stored
		expect(storedDo()).toEqual({ 0: 90, 1800: 80, 3600: 70 });
	});

	it("replaces a stored value with onConflict: 'replace'", async () => {
		const response = await postPoints(runId, {
			points: [{ time_h: 0.5, do_percent: 75 }],
			onConflict: 'replace'
		});
		expect(response.status).toBe(201);
		expect(await response.json()).toMatchObject({ inserted: 0, unchanged: 0, replaced: 1 });
		remember(1800, 'do_percent', 75);
		expect(storedDo()[1800]).toBe(75);
	});

	it('refuses points out of time order with 422 at points.2.time_h, storing nothing', async () => {
		const response = await postPoints(runId, {
			points: [
				{ time_h: 2, do_percent: 60 },
				{ time_h: 3, do_percent: 50 },
				{ time_h: 2.5, do_percent: 55 }
			]
		});
		expect(response.status).toBe(422);
		expect(response.headers.get('content-type')).toContain('application/problem+json');
		const { errors } = (await response.json()) as {
			errors: { path: string; message: string }[];
		};
		const atPoint = errors.find((e) => e.path === 'points.2.time_h');
		expect(atPoint?.message).toMatch(/^Point 2/);
		expect(storedDo()[7200]).toBeUndefined();
	});

	it('refuses a key that is no signal with 422, naming the signal meant', async () => {
		const response = await postPoints(runId, { points: [{ time_h: 2, do_ppm: 7 }] });
		expect(response.status).toBe(422);
		const problem = await response.json();
		expect(problem.errors.map((e: { message: string }) => e.message).join(' ')).toContain(
			'do_percent'
		);
		expect(problem.detail).toContain('do_ppm');
		// the key is no point's fault: named at the level of the points, not as point 0's
		expect(problem.errors[0].path).toBe('points.do_ppm');
	});

	it('refuses a misspelt top-level key with 400 naming it', async () => {
		const response = await postPoints(runId, { point: [{ time_h: 2, do_percent: 60 }] });
		expect(response.status).toBe(400);
		const problem = await response.json();
		expect(problem.errors.map((e: { path: string }) => e.path)).toContain('point');
	});

	it('stores a CSV body sent as text/csv, and replaces with ?onConflict=replace', async () => {
		const csv = ['time_h,do_percent,ph', '3,60,6.8', '3.5,55,6.9'].join('\n');
		const stored = await postText(runId, csv, 'text/csv; charset=utf-8');
		expect(stored.status).toBe(201);
		expect(await stored.json()).toMatchObject({ inserted: 4, unchanged: 0, replaced: 0 });
		remember(10800, 'do_percent', 60);
		remember(10800, 'ph', 6.8);
		remember(12600, 'do_percent', 55);
		remember(12600, 'ph', 6.9);

		const clash = ['time_h,do_percent,ph', '3,61,6.8'].join('\n');
		expect((await postText(runId, clash, 'text/csv')).status).toBe(409);
		expect(storedDo()[10800]).toBe(60);

		const replaced = await postText(runId, clash, 'text/csv', '?onConflict=replace');
		expect(replaced.status).toBe(201);
		expect(await replaced.json()).toMatchObject({ inserted: 0, unchanged: 1, replaced: 1 });
		remember(10800, 'do_percent', 61);
		expect(storedDo()[10800]).toBe(61);
	});

	it('refuses another content type with 415', async () => {
		const response = await postText(runId, 'time_h,do_percent\n9,50', 'text/plain');
		expect(response.status).toBe(415);
		expect((await response.json()).detail).toMatch(/application\/json.*text\/csv/);
	});

	it('answers 404 for a run that does not exist', async () => {
		const response = await postPoints(crypto.randomUUID(), { points: first });
		expect(response.status).toBe(404);
	});

	it('refuses a prep technician with 403 and stores nothing', async () => {
		const response = await postPoints(
			runId,
			{ points: [{ time_h: 9, do_percent: 40 }] },
			prepTechnician
		);
		expect(response.status).toBe(403);
		expect(storedDo()[9 * 3600]).toBeUndefined();
	});

	describe('GET /api/v1/runs/{id}/data', () => {
		const get = (query: string) =>
			getFrom('/api/v1/runs/[id]/data', `${dataPath(runId)}${query}`, { id: runId });
		const timesInOrder = () => [...expected.keys()].sort((a, b) => a - b);

		it('gives a page of rows in time order, with the total of distinct times', async () => {
			const response = await get('?page=1&limit=2');
			expect(response.status).toBe(200);
			const body = await response.json();
			expect(body.total).toBe(expected.size);
			expect(body).toMatchObject({ page: 1, limit: 2 });
			expect(body.rows).toEqual(
				timesInOrder()
					.slice(0, 2)
					.map((t) => ({ timeS: t, values: expected.get(t) }))
			);
			const last = await (await get('?page=3&limit=2')).json();
			expect(last.rows).toEqual(
				timesInOrder()
					.slice(4, 6)
					.map((t) => ({ timeS: t, values: expected.get(t) }))
			);
		});

		it('gives every point as CSV with format=csv, which reads back to the stored values', async () => {
			const response = await get('?format=csv');
			expect(response.status).toBe(200);
			expect(response.headers.get('content-type')).toContain('text/csv');
			const text = await response.text();
			expect(text.split(/\r?\n/)[0]).toBe('time_s,do_percent,ph');
			const parsed = Papa.parse<Record<string, number | null>>(text, {
				header: true,
				dynamicTyping: true,
				skipEmptyLines: true
			});
			expect(parsed.errors).toEqual([]);
			expect(
				parsed.data.map(({ time_s, ...values }) => ({
					timeS: time_s,
					values: Object.fromEntries(Object.entries(values).filter(([, v]) => v !== null))
				}))
			).toEqual(timesInOrder().map((t) => ({ timeS: t, values: expected.get(t) })));
		});

		it('refuses limit=0 with 400', async () => {
			const response = await get('?page=1&limit=0');
			expect(response.status).toBe(400);
			const problem = await response.json();
			expect(problem.errors.map((e: { path: string }) => e.path)).toContain('limit');
		});
	});
});

describe('GET /api/v1/runs/{id}/analysis', () => {
	// CODATA 2018 (exact since the 2019 SI): R = 8.314462618 J/(mol·K); 0 °C = 273.15 K.
	const R_J_PER_MOL_K = 8.314462618;
	const REFERENCE_K = 273.15;
	const REFERENCE_KPA = 101.325;
	// Dry air at the inlet, as the product assumes when no inlet analysis is logged.
	const AIR_O2 = 0.2095;
	const AIR_CO2 = 0.0004;
	const GAS_FLOW_L_PER_MIN = 8;
	const VOLUME_L = 6.4;
	const hours = [0, 0.5, 1, 1.5, 2, 2.5, 3, 3.5, 4];
	const exhaustO2Percent = (h: number) => 20.6 - 0.15 * h;
	const exhaustCo2Percent = (h: number) => 0.35 + 0.14 * h;
	const dryWeight = [
		{ time_h: 0, dry_weight_g_per_l: 0.5 },
		{ time_h: 2, dry_weight_g_per_l: 0.74 },
		{ time_h: 4, dry_weight_g_per_l: 1.1 }
	];
	let runId: string;

	/**
	 * The inert-gas (N2) balance worked out here on its own: inlet in mol/h from the ideal gas law at
	 * the reference conditions, outlet flow from the inert fractions, OUR the O2 that went missing.
	 */
	function ourByHand(h: number): number {
		const molarVolumeLPerMol = (R_J_PER_MOL_K * REFERENCE_K) / REFERENCE_KPA;
		const inletMolPerH = (GAS_FLOW_L_PER_MIN * 60) / molarVolumeLPerMol;
		const o2Out = exhaustO2Percent(h) / 100;
		const co2Out = exhaustCo2Percent(h) / 100;
		const outletMolPerH = (inletMolPerH * (1 - AIR_O2 - AIR_CO2)) / (1 - o2Out - co2Out);
		const o2TakenMolPerH = inletMolPerH * AIR_O2 - outletMolPerH * o2Out;
		return (o2TakenMolPerH * 1000) / VOLUME_L;
	}

	beforeAll(async () => {
		runId = newRun('API analysis run').id;
		const gas = hours.map((h) => ({
			time_h: h,
			gas_flow_l_per_min: GAS_FLOW_L_PER_MIN,
			exhaust_o2_percent: exhaustO2Percent(h),
			exhaust_co2_percent: exhaustCo2Percent(h),
			volume_l: VOLUME_L
		}));
		expect((await postPoints(runId, { points: gas })).status).toBe(201);
		expect((await postPoints(runId, { points: dryWeight })).status).toBe(201);
	});

	it('gives the latest OUR of the inert-gas balance, the plan and the dry weight sent', async () => {
		const response = await getFrom('/api/v1/runs/[id]/analysis', `/api/v1/runs/${runId}/analysis`, {
			id: runId
		});
		expect(response.status).toBe(200);
		const analysis = await response.json();
		expect(analysis.gas.latest.timeH).toBe(4);
		const expectedOur = ourByHand(4);
		expect(expectedOur).toBeGreaterThan(10);
		expect(Math.abs(analysis.gas.latest.our - expectedOur) / expectedOur).toBeLessThan(1e-9);
		expect(analysis.gas.timeH).toEqual(hours);
		expect(analysis.plan).not.toBeNull();
		expect(analysis.plan.timeH.length).toBeGreaterThan(1);
		expect(analysis.chart.dry_weight_g_per_l).toEqual({
			timeH: dryWeight.map((p) => p.time_h),
			value: dryWeight.map((p) => p.dry_weight_g_per_l)
		});
	});
});

describe('GET /api/v1/runs', () => {
	let run: { id: string; number: string };
	const list = (query = '') => getFrom('/api/v1/runs', `/api/v1/runs${query}`);

	beforeAll(() => {
		run = newRun('Listed glycerol run');
	});

	it('lists the run with its study name', async () => {
		const response = await list('?limit=100');
		expect(response.status).toBe(200);
		const body = await response.json();
		const row = body.items.find((r: { id: string }) => r.id === run.id);
		expect(row).toMatchObject({
			number: run.number,
			name: 'Listed glycerol run',
			studyId,
			studyName: STUDY_NAME,
			vesselName: 'Bench stirred tank BST-10',
			state: 'open'
		});
	});

	it('filters with q', async () => {
		const found = await (await list(`?q=${encodeURIComponent('listed glycerol')}`)).json();
		expect(found.items.map((r: { id: string }) => r.id)).toEqual([run.id]);
		expect(found.total).toBe(1);
		const none = await (await list('?q=no-such-run-anywhere')).json();
		expect(none).toMatchObject({ items: [], total: 0, next: null });
	});
});
