import { afterEach, describe, expect, it, vi } from 'vitest';
import {
	MAX_FEED_LABEL_LENGTH,
	MAX_FEED_STREAMS,
	simulateRun,
	type FeedInput,
	type SimulationRequest
} from '$chemistry';
import { createApiClient, resultOf } from '$lib/api/client';
import { buildSimulationCharts, type SimulationRunView } from '$lib/simulation/chart-series';
import { listFeedDeliveries } from '$lib/simulation/feed-stream-results';
import {
	createFeedStream,
	FEED_LABEL_MAX_LENGTH,
	MAX_FORM_FEED_STREAMS,
	moveFeedStreamErrors
} from '$lib/simulation/feed-stream-values';
import {
	buildSimulationRequest,
	createDemoValues,
	feedStreamPath,
	readSimulationRequest,
	type SimulationFormValues
} from '$lib/simulation/form-values';
import { formatSeriesCsv } from '$lib/simulation/series-csv';
import { enterEvent } from './endpoint-call';

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

/** The browser's fetch answered by the real simulate endpoint, so the client reads a real problem+json. */
function answerFetchWithEndpoint() {
	vi.stubGlobal('fetch', async (request: Request) => POST(enterEvent(request, { user: engineer })));
}

/** The app's client, at an address a Request can be made for outside a page. */
const api = createApiClient({ baseUrl: 'http://127.0.0.1' });

afterEach(() => {
	vi.unstubAllGlobals();
});

const base = {
	mode: 'fedBatch',
	kinetics: { muMaxPerH: 0.6, ksGPerL: 0.05, yieldXS: 0.5, yieldXO2: 1, koMgPerL: 0.1 },
	initial: { biomassGPerL: 0.1, substrateGPerL: 20, volumeL: 5 },
	oxygen: { kLaPerH: 500, saturationMgPerL: 7 },
	maxVolumeL: 12,
	endH: 24,
	outputEveryH: 0.5
} satisfies Omit<SimulationRequest, 'feed' | 'feeds'>;

const glucoseDoStat: FeedInput = {
	label: 'Glucose',
	strategy: 'doStat',
	substrateGPerL: 500,
	startH: 8,
	doSetpointMgPerL: 2,
	maxRateLPerH: 0.1
};
const aminoAcids: FeedInput = {
	label: 'Amino acids',
	strategy: 'constant',
	substrateGPerL: 0,
	startH: 10,
	rateLPerH: 0.01,
	bolusL: 0.05
};
const rampByExpression: FeedInput = {
	strategy: 'expression',
	substrateGPerL: 300,
	startH: 12,
	expression: '0.005 * (t - 12)',
	maxRateLPerH: 0.05
};

function readInto(request: SimulationRequest): SimulationFormValues {
	const read = readSimulationRequest(request);
	if (!read.ok) throw new Error(read.message);
	return read.values;
}

describe('feed streams in the simulation form', () => {
	it('keeps one stream as the single feed, exactly the request the page sent before streams', () => {
		const built = buildSimulationRequest(createDemoValues());
		expect(built).toEqual({
			ok: true,
			request: {
				mode: 'fedBatch',
				kinetics: {
					muMaxPerH: 0.6,
					ksGPerL: 0.05,
					yieldXS: 0.5,
					maintenanceGPerGH: 0.03,
					yieldXO2: 1,
					koMgPerL: 0.1
				},
				initial: { biomassGPerL: 0.1, substrateGPerL: 20, volumeL: 5 },
				feed: { strategy: 'exponential', substrateGPerL: 500, startH: 8, muSetPerH: 0.2 },
				oxygen: { kLaPerH: 500, saturationMgPerL: 7 },
				maxVolumeL: 12,
				endH: 24,
				outputEveryH: 0.1
			}
		});
	});

	it('reads a labelled single feed back into one stream and sends it as feed again', () => {
		const request: SimulationRequest = { ...base, feed: glucoseDoStat };
		const values = readInto(request);
		expect(values.feeds).toHaveLength(1);
		expect(values.feeds[0]).toMatchObject({ label: 'Glucose', strategy: 'doStat' });
		expect(buildSimulationRequest(values)).toEqual({ ok: true, request });
	});

	it.each([
		['two', [glucoseDoStat, aminoAcids]],
		['three', [glucoseDoStat, aminoAcids, rampByExpression]]
	])('reads %s streams into the form and builds the same request from it', (_, feeds) => {
		const request: SimulationRequest = { ...base, feeds };
		const values = readInto(request);
		expect(values.feeds.map((s) => [s.label, s.strategy])).toEqual(
			feeds.map((f) => [f.label ?? '', f.strategy])
		);
		expect(values.feeds[1].numbers.substrateGPerL).toBe('0');
		expect(buildSimulationRequest(values)).toEqual({ ok: true, request });
	});

	it('sends what the form builds with three streams as a run the science library accepts', () => {
		const values = readInto({ ...base, feeds: [glucoseDoStat, aminoAcids, rampByExpression] });
		const built = buildSimulationRequest(values);
		if (!built.ok) throw new Error(JSON.stringify(built.fieldErrors));
		const result = simulateRun(built.request);
		expect(result.feedStreams?.map((s) => s.label)).toEqual(['Glucose', 'Amino acids', null]);
		// The constant stream from 10 h to 24 h at 0.01 L/h plus its 0.05 L bolus (analytic).
		expect(result.feedStreams?.[1].deliveredL).toBeCloseTo(0.05 + 0.01 * 14, 8);
	});

	it('keeps a lone stream saved as feeds a list, since feed would refuse its zero substrate', () => {
		const request: SimulationRequest = { ...base, feeds: [aminoAcids] };
		expect(buildSimulationRequest(readInto(request))).toEqual({ ok: true, request });
	});

	it('refuses a scenario with more streams than the page edits rather than cutting it', () => {
		const five = [glucoseDoStat, aminoAcids, rampByExpression, aminoAcids, aminoAcids];
		const read = readSimulationRequest({ ...base, feeds: five });
		expect(read).toEqual({
			ok: false,
			message: expect.stringContaining(
				'This scenario has 5 feed streams and this page edits at most 3'
			)
		});
		expect(MAX_FORM_FEED_STREAMS).toBeLessThanOrEqual(MAX_FEED_STREAMS);
	});

	it('names each stream’s own fields in its errors and sends a second stream as feeds', () => {
		const values = createDemoValues();
		values.feeds.push(
			createFeedStream({
				label: '  Amino acids ',
				numbers: { substrateGPerL: '0', rateLPerH: '' } as never
			})
		);
		// A blank field is left out, and the request schema names what is missing.
		const missing = 'Feed stream 2 rate F must be a finite number greater than 0.';
		expect(buildSimulationRequest(values)).toEqual({
			ok: false,
			fieldErrors: { 'feeds.1.rateLPerH': missing },
			message: missing
		});
		values.feeds[1].numbers.rateLPerH = '0.02';
		const built = buildSimulationRequest(values);
		expect(built.ok && built.request.feeds).toEqual([
			{ strategy: 'exponential', substrateGPerL: 500, startH: 8, muSetPerH: 0.2 },
			{ strategy: 'constant', label: 'Amino acids', substrateGPerL: 0, rateLPerH: 0.02 }
		]);
		expect(built.ok && built.request).not.toHaveProperty('feed');
	});

	it('refuses a label longer than the science library takes, at the label', () => {
		expect(FEED_LABEL_MAX_LENGTH).toBe(MAX_FEED_LABEL_LENGTH);
		const values = createDemoValues();
		values.feeds[0].label = 'x'.repeat(FEED_LABEL_MAX_LENGTH + 1);
		const tooLong = 'Feed name must be at most 80 characters (got 81).';
		expect(buildSimulationRequest(values)).toEqual({
			ok: false,
			fieldErrors: { 'feed.label': tooLong },
			message: tooLong
		});
	});

	it('refuses what the API refuses, at the same field of the second stream and in the same words', async () => {
		answerFetchWithEndpoint();
		const request = { ...base, feeds: [glucoseDoStat, { ...aminoAcids, rateLPerH: -0.01 }] };
		const values = readInto({
			...base,
			feeds: [glucoseDoStat, { ...aminoAcids, rateLPerH: 0.01 }]
		});
		values.feeds[1].numbers.rateLPerH = '-0.01';
		const built = buildSimulationRequest(values);
		const answer = await resultOf(api.POST('/api/v1/simulate', { body: request }));
		expect(answer.ok).toBe(false);
		expect(built.ok).toBe(false);
		if (answer.ok || built.ok) return;
		const secondRateField = `${feedStreamPath(values, 1)}.rateLPerH`;
		expect(secondRateField).toBe('feeds.1.rateLPerH');
		expect(Object.keys(answer.fieldErrors)).toEqual([secondRateField]);
		expect(built.fieldErrors).toEqual(answer.fieldErrors);
		expect(built.message).toBe(answer.message);
		expect(answer.fieldErrors[secondRateField]).toMatch(/^Feed stream 2 rate F must be/);
	});

	it('keeps its own word for text that is not a number, and the schema’s for the rest', () => {
		const values = createDemoValues();
		values.numbers.endH = 'soon';
		values.numbers['kinetics.muMaxPerH'] = '-1';
		const built = buildSimulationRequest(values);
		expect(built).toEqual({
			ok: false,
			fieldErrors: {
				endH: 'End time (h): “soon” is not a number.',
				'kinetics.muMaxPerH': 'μmax must be greater than 0 and less than 50 (got -1).'
			}
		});
	});

	it('moves field errors with their stream when streams are added or removed', () => {
		const errors = {
			feed: 'fedBatch mode needs the feed.',
			'feed.rateLPerH': 'Required.',
			endH: 'Required.'
		};
		expect(moveFeedStreamErrors(errors, [{ from: 'feed', to: 'feeds.0' }])).toEqual({
			feed: 'fedBatch mode needs the feed.',
			'feeds.0.rateLPerH': 'Required.',
			endH: 'Required.'
		});
		const three = {
			'feeds.0.bolusL': 'a',
			'feeds.1.rateLPerH': 'b',
			'feeds.1': 'c',
			'feeds.2.startH': 'd'
		};
		const removeSecond = [
			{ from: 'feeds.0', to: 'feeds.0' },
			{ from: 'feeds.1', to: null },
			{ from: 'feeds.2', to: 'feeds.1' }
		];
		expect(moveFeedStreamErrors(three, removeSecond)).toEqual({
			'feeds.0.bolusL': 'a',
			'feeds.1.startH': 'd'
		});
		expect(
			moveFeedStreamErrors({ 'feeds.1.startH': 'd' }, [
				{ from: 'feeds.0', to: null },
				{ from: 'feeds.1', to: 'feed' }
			])
		).toEqual({ 'feed.startH': 'd' });
	});
});

describe('feed streams in the results', () => {
	const t = [0, 1, 2];
	const twoStreams: SimulationRunView['result'] = {
		t,
		biomassGPerL: [1, 2, 3],
		substrateGPerL: [5, 4, 3],
		productGPerL: [0, 0, 0],
		volumeL: [5, 5.1, 5.3],
		dissolvedOxygenMgPerL: null,
		feedLPerH: [0, 0.15, 0.25],
		feedStreams: [
			{ label: 'Glucose', strategy: 'doStat', feedLPerH: [0, 0.1, 0.2], deliveredL: 0.25 },
			{ label: null, strategy: 'constant', feedLPerH: [0, 0.05, 0.05], deliveredL: 0.1 }
		],
		ourMmolPerLH: null,
		maxOtrMmolPerLH: null,
		events: []
	};
	const oneStream: SimulationRunView['result'] = {
		...twoStreams,
		feedLPerH: [0, 0.1, 0.2],
		feedStreams: [
			{ label: null, strategy: 'exponential', feedLPerH: [0, 0.1, 0.2], deliveredL: 0.25 }
		]
	};
	const volumeChart = (runs: SimulationRunView[]) =>
		buildSimulationCharts(runs).find((spec) => spec.id === 'volume')!;

	it('draws each stream’s rate beside the total when there are several, and only the total for one', () => {
		const several = volumeChart([{ label: 'Current inputs', result: twoStreams }]);
		expect(several.series.map((s) => s.label)).toEqual([
			'Volume V',
			'Total feed rate F',
			'Glucose',
			'Feed 2'
		]);
		expect(several.series[3]).toMatchObject({
			axis: 'y2',
			points: [
				{ x: 0, y: 0 },
				{ x: 1, y: 0.05 },
				{ x: 2, y: 0.05 }
			]
		});
		expect(
			volumeChart([{ label: 'Current inputs', result: oneStream }]).series.map((s) => s.label)
		).toEqual(['Volume V', 'Feed rate F']);
	});

	it('exports one rate column per stream, headed with its label, and none for a lone stream', () => {
		const lines = formatSeriesCsv([{ label: 'A', result: twoStreams }]).split('\n');
		expect(
			lines[0].endsWith(
				',feed_l_per_h,our_mmol_per_l_h,max_otr_mmol_per_l_h,feed_1_l_per_h (Glucose),feed_2_l_per_h'
			)
		).toBe(true);
		expect(lines[2].endsWith(',0.1,0.05')).toBe(true);
		const single = formatSeriesCsv([{ label: 'A', result: oneStream }]).split('\n');
		expect(single[0]).toBe(
			't_h,biomass_g_per_l,substrate_g_per_l,product_g_per_l,volume_l,dissolved_oxygen_mg_per_l,feed_l_per_h,our_mmol_per_l_h,max_otr_mmol_per_l_h'
		);
		const compared = formatSeriesCsv([
			{ label: 'A', result: oneStream },
			{ label: 'B', result: twoStreams }
		]).split('\n');
		expect(compared[1]).toBe('A,0,1,5,0,5,,0,,,,');
		expect(compared[4]).toBe('B,0,1,5,0,5,,0,,,0,0');
	});

	it('lists what each stream delivered, named as on the charts', () => {
		expect(listFeedDeliveries([{ label: 'Current inputs', result: twoStreams }])).toEqual([
			{ run: 'Current inputs', stream: 'Glucose', strategy: 'doStat', deliveredL: 0.25 },
			{ run: 'Current inputs', stream: 'Feed 2', strategy: 'constant', deliveredL: 0.1 }
		]);
	});
});
