import { describe, expect, it, vi } from 'vitest';
import { postJson } from './endpoint-call';

// The endpoints' guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

const { POST } = await import('../../src/routes/api/v1/simulate/+server');

const engineer = {
	id: 'u-engineer',
	email: 'engineer@lab.test',
	name: 'Engineer',
	roles: ['engineer']
};

const postSimulate = (body: unknown, user: typeof engineer | null = engineer) =>
	postJson(POST, '/api/v1/simulate', body, { user });

const twoStreams = {
	mode: 'fedBatch',
	kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5 },
	initial: { biomassGPerL: 0.5, substrateGPerL: 1, volumeL: 1 },
	feeds: [
		{ label: 'Glucose', strategy: 'constant', substrateGPerL: 300, rateLPerH: 0.02 },
		{ label: 'Amino acids', strategy: 'constant', substrateGPerL: 0, rateLPerH: 0.01, startH: 4 }
	],
	endH: 10,
	outputEveryH: 0.5
};

describe('POST /api/v1/simulate with several feed streams', () => {
	it('answers each stream’s rates and delivered volume in feedStreams', async () => {
		const response = await postSimulate(twoStreams);
		expect(response.status).toBe(200);
		const body = await response.json();
		expect(body.feedStreams.map((s: { label: string }) => s.label)).toEqual([
			'Glucose',
			'Amino acids'
		]);
		expect(body.feedStreams[1].feedLPerH).toHaveLength(body.t.length);
		// ∫ of a constant rate from the stream's start (analytic): 0.02·10 and 0.01·6 L.
		expect(body.feedStreams[0].deliveredL).toBeCloseTo(0.2, 10);
		expect(body.feedStreams[1].deliveredL).toBeCloseTo(0.06, 10);
		expect(body.events.map((e: { message: string }) => e.message)).toContain(
			'Feed “Amino acids” (constant rate) started.'
		);
	});

	it('sends no series twice: a lone stream’s rate is feedLPerH, the maximum OTR one figure', async () => {
		const { feeds, ...rest } = twoStreams;
		const response = await postSimulate({
			...rest,
			kinetics: { ...rest.kinetics, yieldXO2: 1 },
			feed: feeds[0],
			oxygen: { kLaPerH: 100, saturationMgPerL: 7 }
		});
		expect(response.status).toBe(200);
		const body = await response.json();
		expect(body.feedStreams).toHaveLength(1);
		expect(body.feedStreams[0].feedLPerH).toBeNull();
		expect(body.feedLPerH.every((rate: number) => rate === 0.02)).toBe(true);
		// kLa·C* = 100 /h × 7 mg/L over O2's 31.998 g/mol (IUPAC 2021).
		expect(body.maxOtrMmolPerLH).toBeCloseTo(700 / 31.998, 10);
	});

	it('refuses an unknown strategy in a stream as a problem naming feeds.0.strategy', async () => {
		const feeds = [{ ...twoStreams.feeds[0], strategy: 'pulsed' }, twoStreams.feeds[1]];
		const response = await postSimulate({ ...twoStreams, feeds });
		expect(response.status).toBe(400);
		expect(response.headers.get('content-type')).toContain('application/problem+json');
		const body = await response.json();
		expect(body.errors.map((e: { path: string }) => e.path)).toEqual(['feeds.0.strategy']);
	});

	it('runs behind the real guard: signed out is a 401', async () => {
		expect((await postSimulate(twoStreams, null)).status).toBe(401);
	});

	it('passes the library’s stream errors through with their field', async () => {
		const feeds = [twoStreams.feeds[0], { strategy: 'constant', substrateGPerL: 0 }];
		const response = await postSimulate({ ...twoStreams, feeds });
		expect(response.status).toBe(400);
		const body = await response.json();
		expect(body.errors).toEqual([{ path: 'feeds.1.rateLPerH', message: body.detail }]);
	});

	it('reports every refusal of the request at once, each at its field with the library’s words', async () => {
		const feeds = [
			{ ...twoStreams.feeds[0], rateLPerH: -1 },
			{ ...twoStreams.feeds[1], startH: 12 }
		];
		const response = await postSimulate({
			...twoStreams,
			kinetics: { ...twoStreams.kinetics, ksGPerL: 0 },
			feeds
		});
		expect(response.status).toBe(400);
		const body = await response.json();
		expect(body.errors).toEqual([
			{ path: 'kinetics.ksGPerL', message: 'Ks must be greater than 0 (got 0).' },
			{
				path: 'feeds.0.rateLPerH',
				message: 'Feed stream 1 rate F must be greater than 0 (got -1).'
			},
			{
				path: 'feeds.1.startH',
				message: 'Feed stream 2 start (12 h) must be before the end time (10 h).'
			}
		]);
		// The detail a person reads lists all three by their labels, not the request's paths.
		expect(body.detail).toBe(
			'The request has 3 invalid fields. Ks must be greater than 0 (got 0). Feed stream 1 rate F must be greater than 0 (got -1). Feed stream 2 start (12 h) must be before the end time (10 h).'
		);
	});
});
