import { describe, expect, it } from 'vitest';
import {
	MAX_FEED_STREAMS,
	simulateRun,
	SUBSTRATE_STAT_GAIN_PER_MU_MAX,
	type FeedInput,
	type SimulationRequest,
	type SimulationResult
} from '../../chemistry/simulation';
import { errorOf } from './input-error';

const kinetics = { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5 };

function fedBatch(
	feeds: FeedInput[],
	overrides: Partial<SimulationRequest> = {}
): SimulationRequest {
	return {
		mode: 'fedBatch',
		kinetics,
		initial: { biomassGPerL: 0.5, substrateGPerL: 1, volumeL: 1 },
		feeds,
		endH: 20,
		outputEveryH: 0.5,
		...overrides
	};
}

/** Growth so slow that uptake is below 1e-11 g/L/h: the balances reduce to mixing and dilution. */
const noGrowth: Partial<SimulationRequest> = {
	kinetics: { muMaxPerH: 1e-6, ksGPerL: 0.1, yieldXS: 0.5 },
	initial: { biomassGPerL: 1e-6, substrateGPerL: 4, volumeL: 1 }
};

function streams(r: SimulationResult) {
	if (r.feedStreams === null) throw new Error('no feedStreams in a fed-batch result');
	return r.feedStreams;
}

/**
 * The integrator holds each step to 1e-8 relative, and its dense output between steps (the output
 * times) is of lower order, a few 1e-6 relative on long steps; so values at output times are
 * checked to 1e-5 relative and the end of the run, where a step ends, tighter.
 */
function expectRelativelyClose(actual: number, expected: number, tolerance: number): void {
	expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tolerance * Math.abs(expected));
}

describe('several feed streams: mass balances', () => {
	it('two constant streams act as one of rate F1 + F2 at the flow-weighted concentration', () => {
		// Mass balance, analytic: F1(S1 − S)/V + F2(S2 − S)/V = ((F1 + F2)/V)(S̄ − S) with
		// S̄ = (F1·S1 + F2·S2)/(F1 + F2), and X, P and V see only F1 + F2, so both runs solve the same
		// ODE. Here S̄ = (0.01·300 + 0.03·100)/0.04 = 150 g/L.
		const culture: Partial<SimulationRequest> = {
			kinetics: { ...kinetics, maintenanceGPerGH: 0.02, alpha: 0.1, beta: 0.01 }
		};
		const two = simulateRun(
			fedBatch(
				[
					{ strategy: 'constant', substrateGPerL: 300, rateLPerH: 0.01, startH: 2 },
					{ strategy: 'constant', substrateGPerL: 100, rateLPerH: 0.03, startH: 2 }
				],
				culture
			)
		);
		const one = simulateRun(
			fedBatch([{ strategy: 'constant', substrateGPerL: 150, rateLPerH: 0.04, startH: 2 }], culture)
		);
		expect(two.t).toEqual(one.t);
		for (let i = 0; i < one.t.length; i++) {
			// Both integrated to 1e-8 relative per step, on different step sequences.
			expectRelativelyClose(two.biomassGPerL[i], one.biomassGPerL[i], 1e-5);
			expect(two.substrateGPerL[i]).toBeCloseTo(one.substrateGPerL[i], 6);
			expectRelativelyClose(two.productGPerL[i], one.productGPerL[i], 1e-5);
			expectRelativelyClose(two.volumeL[i], one.volumeL[i], 1e-9);
			expect(two.feedLPerH[i]).toBeCloseTo(one.feedLPerH[i], 12);
		}
	});

	it('mixes streams into a culture that does not grow: S·V = S0·V0 + Σ S_f,i·F_i·t', () => {
		// Mass balance, analytic: without uptake d(S·V)/dt = Σ F_i·S_f,i and dV/dt = Σ F_i. The second
		// stream carries no substrate, so it only dilutes.
		const r = simulateRun(
			fedBatch(
				[
					{ strategy: 'constant', substrateGPerL: 200, rateLPerH: 0.01 },
					{ strategy: 'constant', substrateGPerL: 0, rateLPerH: 0.02 }
				],
				noGrowth
			)
		);
		const end = r.t.length - 1;
		for (let i = 0; i <= end; i++) {
			const t = r.t[i];
			const volumeL = 1 + 0.03 * t;
			expect(r.volumeL[i]).toBeCloseTo(volumeL, 12);
			const substrate = (4 * 1 + 200 * 0.01 * t) / volumeL;
			expectRelativelyClose(r.substrateGPerL[i], substrate, i === end ? 1e-9 : 1e-5);
		}
	});

	it('a stream without substrate dilutes S as V0/V(t)', () => {
		// Pure dilution, analytic: with no uptake and S_f = 0, d(S·V)/dt = 0, so S(t) = S0·V0/V(t);
		// a linear ramp gives V(t) = V0 + F0·t + slope·t²/2.
		const r = simulateRun(
			fedBatch(
				[{ strategy: 'linear', substrateGPerL: 0, rateLPerH: 0.02, slopeLPerH2: 0.004 }],
				noGrowth
			)
		);
		const end = r.t.length - 1;
		for (let i = 0; i <= end; i++) {
			const t = r.t[i];
			const volumeL = 1 + 0.02 * t + (0.004 * t * t) / 2;
			expect(r.volumeL[i]).toBeCloseTo(volumeL, 12);
			expectRelativelyClose(r.substrateGPerL[i] * r.volumeL[i], 4 * 1, i === end ? 1e-9 : 1e-5);
		}
		expect(r.substrateGPerL[end]).toBeLessThan(0.5 * 4);
	});

	it('closes the substrate balance of a growing culture with each stream’s delivered volume', () => {
		// Monod mass balance without maintenance (Monod 1949): d(XV)/dt = μXV and
		// d(SV)/dt = −μXV/Yx/s + Σ F_i·S_f,i, so X·V + Yx/s·S·V − Yx/s·Σ S_f,i·D_i stays at
		// X0·V0 + Yx/s·S0·V0, D_i each stream's delivered volume (bolus included).
		const r = simulateRun(
			fedBatch(
				[
					{ strategy: 'exponential', substrateGPerL: 250, muSetPerH: 0.15, startH: 3 },
					{ strategy: 'constant', substrateGPerL: 0, rateLPerH: 0.01, startH: 6, bolusL: 0.1 },
					{ strategy: 'constant', substrateGPerL: 50, rateLPerH: 0.005, startH: 9 }
				],
				{ endH: 24 }
			)
		);
		const [exponential, water, lean] = streams(r);
		const end = r.t.length - 1;
		const yxs = kinetics.yieldXS;
		const vEnd = r.volumeL[end];
		const conserved =
			r.biomassGPerL[end] * vEnd +
			yxs * r.substrateGPerL[end] * vEnd -
			yxs * (250 * exponential.deliveredL + 0 * water.deliveredL + 50 * lean.deliveredL);
		expectRelativelyClose(conserved, 0.5 * 1 + yxs * 1 * 1, 1e-7);
		// Volume balance (dV/dt = Σ F_i, boluses add theirs).
		expect(exponential.deliveredL + water.deliveredL + lean.deliveredL).toBeCloseTo(vEnd - 1, 10);
	});
});

describe('several feed streams: delivered volumes, rates and starts', () => {
	const staggered: FeedInput[] = [
		{ strategy: 'constant', substrateGPerL: 200, rateLPerH: 0.02 },
		{ strategy: 'constant', substrateGPerL: 0, rateLPerH: 0.05, startH: 4, bolusL: 0.2 },
		{ strategy: 'linear', substrateGPerL: 100, rateLPerH: 0.01, slopeLPerH2: 0.002, startH: 8 }
	];

	it('delivers rate × time from each stream’s start, plus its bolus', () => {
		const r = simulateRun(fedBatch(staggered));
		const [a, b, c] = streams(r);
		// ∫ of a constant and of a linear ramp, analytic.
		expect(a.deliveredL).toBeCloseTo(0.02 * 20, 12);
		expect(b.deliveredL).toBeCloseTo(0.2 + 0.05 * (20 - 4), 12);
		expect(c.deliveredL).toBeCloseTo(0.01 * 12 + (0.002 * 12 * 12) / 2, 12);
		const end = r.t.length - 1;
		expect(a.deliveredL + b.deliveredL + c.deliveredL).toBeCloseTo(r.volumeL[end] - 1, 12);
		expect(r.stoppedAtH).toBeUndefined();
	});

	it('reports each stream’s rate from its start, and their sum as feedLPerH', () => {
		const r = simulateRun(fedBatch(staggered));
		const [a, b, c] = streams(r).map((stream) => ({ ...stream, feedLPerH: stream.feedLPerH! }));
		expect(a.feedLPerH).toHaveLength(r.t.length);
		for (let i = 0; i < r.t.length; i++) {
			const t = r.t[i];
			// An output at a stream's start shows the state after it (as for the single feed).
			expect(a.feedLPerH[i]).toBe(0.02);
			expect(b.feedLPerH[i]).toBe(t >= 4 ? 0.05 : 0);
			expect(c.feedLPerH[i]).toBeCloseTo(t >= 8 ? 0.01 + 0.002 * (t - 8) : 0, 12);
			expect(r.feedLPerH[i]).toBeCloseTo(a.feedLPerH[i] + b.feedLPerH[i] + c.feedLPerH[i], 14);
			// Volume balance, analytic: V0 + what each stream has delivered by t.
			const tb = Math.max(0, t - 4);
			const tc = Math.max(0, t - 8);
			const volumeL = 1 + 0.02 * t + (t >= 4 ? 0.2 : 0) + 0.05 * tb + 0.01 * tc + 0.001 * tc * tc;
			expect(r.volumeL[i]).toBeCloseTo(volumeL, 12);
		}
		expect(b.label).toBeNull();
		expect(c.strategy).toBe('linear');
	});

	it('stops at the maximum volume where the streams together fill it', () => {
		// Volume balance, analytic: V = 1.56 L at 8 h, then 1.56 + 0.08τ + 0.001τ² reaches 1.8 L at
		// τ = (−80 + √(80² + 4·240))/2.
		const r = simulateRun(fedBatch(staggered, { maxVolumeL: 1.8 }));
		const tau = (-80 + Math.sqrt(80 * 80 + 4 * 240)) / 2;
		expect(r.stoppedAtH).toBeCloseTo(8 + tau, 8);
		expect(r.events.at(-1)?.kind).toBe('maxVolumeReached');
		const [a, b, c] = streams(r);
		expect(a.deliveredL).toBeCloseTo(0.02 * (8 + tau), 8);
		expect(b.deliveredL).toBeCloseTo(0.2 + 0.05 * (4 + tau), 8);
		expect(c.deliveredL).toBeCloseTo(0.01 * tau + 0.001 * tau * tau, 8);
		expect(a.deliveredL + b.deliveredL + c.deliveredL).toBeCloseTo(0.8, 8);
	});

	it('cuts a later bolus to the room left and stops there', () => {
		// Volume balance, analytic: 1 + 0.1·5 = 1.5 L at 5 h leaves 0.4 L of the 0.5 L bolus.
		const r = simulateRun(
			fedBatch(
				[
					{ strategy: 'constant', substrateGPerL: 200, rateLPerH: 0.1 },
					{ strategy: 'constant', substrateGPerL: 0, rateLPerH: 0.1, startH: 5, bolusL: 0.5 }
				],
				{ maxVolumeL: 1.9 }
			)
		);
		expect(r.stoppedAtH).toBe(5);
		const [, late] = streams(r);
		expect(late.deliveredL).toBeCloseTo(0.4, 12);
		expect(r.volumeL.at(-1)).toBeCloseTo(1.9, 12);
		const started = r.events.find((e) => e.kind === 'feedStarted');
		expect(started?.message).toBe(
			'Feed 2 of 2 (constant rate) started after 0.4 L of its 0.5 L bolus (the vessel was full).'
		);
		expect(r.events.at(-1)?.kind).toBe('maxVolumeReached');
	});

	it('runs a DO-stat glucose stream beside a constant stream without substrate, named in the events', () => {
		const r = simulateRun({
			mode: 'fedBatch',
			kinetics: { muMaxPerH: 0.3, ksGPerL: 0.1, yieldXS: 0.5, yieldXO2: 1, koMgPerL: 0.1 },
			initial: { biomassGPerL: 0.5, substrateGPerL: 5, volumeL: 1 },
			oxygen: { kLaPerH: 100, saturationMgPerL: 7 },
			feeds: [
				{
					label: 'Glucose concentrate',
					strategy: 'doStat',
					substrateGPerL: 300,
					doSetpointMgPerL: 2,
					maxRateLPerH: 0.01,
					startH: 5
				},
				{
					label: 'Amino acids',
					strategy: 'constant',
					substrateGPerL: 0,
					rateLPerH: 0.005,
					startH: 10,
					bolusL: 0.05
				}
			],
			endH: 40,
			outputEveryH: 0.25
		});
		const started = r.events.filter((e) => e.kind === 'feedStarted');
		expect(started.map((e) => [e.tH, e.message])).toEqual([
			[5, 'Feed “Glucose concentrate” (DO-stat) started.'],
			[10, 'Feed “Amino acids” (constant rate) started after a bolus of 0.05 L.']
		]);
		const [glucose, aminoAcids] = streams(r).map((stream) => ({
			...stream,
			feedLPerH: stream.feedLPerH!
		}));
		expect(glucose.label).toBe('Glucose concentrate');
		expect(aminoAcids.label).toBe('Amino acids');
		// The DO-stat pump runs between 0 and its maximum rate and is throttled once DO falls.
		expect(Math.max(...glucose.feedLPerH)).toBeLessThanOrEqual(0.01);
		expect(Math.min(...glucose.feedLPerH.slice(r.t.indexOf(5)))).toBeLessThan(0.009);
		expect(aminoAcids.deliveredL).toBeCloseTo(0.05 + 0.005 * 30, 12);
		// Monod mass balance without maintenance, as above (Monod 1949).
		const end = r.t.length - 1;
		const vEnd = r.volumeL[end];
		const conserved =
			r.biomassGPerL[end] * vEnd +
			0.5 * r.substrateGPerL[end] * vEnd -
			0.5 * 300 * glucose.deliveredL;
		expectRelativelyClose(conserved, 0.5 + 0.5 * 5, 1e-6);
		expect(glucose.deliveredL + aminoAcids.deliveredL).toBeCloseTo(vEnd - 1, 10);
	});

	it('a substrate-stat stream corrects another stream’s dilution only proportionally', () => {
		// The law supplies uptake + k(S_set − S) (k = 10·μmax) and the second stream dilutes by
		// (F_w/V)·S, so dS/dt = k(S_set − S) − (F_w/V)·S: S settles at k·S_set/(k + F_w/V), analytic
		// (the relaxation, k + F_w/V ≈ 5 /h, is far faster than V changes).
		const k = SUBSTRATE_STAT_GAIN_PER_MU_MAX * kinetics.muMaxPerH;
		const r = simulateRun(
			fedBatch(
				[
					{ strategy: 'substrateStat', substrateGPerL: 300, setpointGPerL: 0.5, maxRateLPerH: 1 },
					{ strategy: 'constant', substrateGPerL: 0, rateLPerH: 0.5 }
				],
				{ endH: 8 }
			)
		);
		for (let i = r.t.indexOf(4); i < r.t.length; i++) {
			const expected = (k * 0.5) / (k + 0.5 / r.volumeL[i]);
			expectRelativelyClose(r.substrateGPerL[i], expected, 2e-3);
			expect(r.substrateGPerL[i]).toBeLessThan(0.5 * 0.99);
		}
	});
});

describe('the single feed as one stream', () => {
	const feed: FeedInput = {
		strategy: 'exponential',
		substrateGPerL: 200,
		muSetPerH: 0.2,
		startH: 3,
		bolusL: 0.05
	};

	it('lists the single feed as one stream whose delivered volume is the volume gained', () => {
		const { feeds: _, ...rest } = fedBatch([]);
		const r = simulateRun({ ...rest, feed });
		const [only] = streams(r);
		expect(streams(r)).toHaveLength(1);
		expect(only).toMatchObject({ label: null, strategy: 'exponential' });
		// A lone stream's rate is the run's total: not sent twice.
		expect(only.feedLPerH).toBeNull();
		expect(only.deliveredL).toBe(r.volumeL.at(-1)! - 1);
		expect(r.events.find((e) => e.kind === 'feedStarted')?.message).toBe(
			'Feed (exponential) started after a bolus of 0.05 L.'
		);
	});

	it('integrates one stream in feeds exactly as the same feed', () => {
		const { feeds: _, ...rest } = fedBatch([]);
		const single = simulateRun({ ...rest, feed });
		const listed = simulateRun(fedBatch([feed]));
		expect(listed.biomassGPerL).toEqual(single.biomassGPerL);
		expect(listed.substrateGPerL).toEqual(single.substrateGPerL);
		expect(listed.volumeL).toEqual(single.volumeL);
		expect(listed.feedStreams).toEqual(single.feedStreams);
	});

	it('does not cut a bolus that exactly fills the vessel (1.2 − 1 < 0.2 in floating point)', () => {
		const { feeds: _, ...rest } = fedBatch([]);
		const r = simulateRun({
			...rest,
			maxVolumeL: 1.2,
			feed: { strategy: 'constant', substrateGPerL: 200, rateLPerH: 0.01, bolusL: 0.2 }
		});
		expect(r.stoppedAtH).toBe(0);
		expect(r.events.find((e) => e.kind === 'feedStarted')?.message).toBe(
			'Feed (constant rate) started after a bolus of 0.2 L.'
		);
		expect(streams(r)[0].deliveredL).toBeCloseTo(0.2, 15);
	});

	it('has no feedStreams outside fed-batch', () => {
		const { feeds: _, ...rest } = fedBatch([]);
		expect(simulateRun({ ...rest, mode: 'batch' }).feedStreams).toBeNull();
		const chemostat = simulateRun({
			...rest,
			mode: 'chemostat',
			dilutionPerH: 0.2,
			feed: { strategy: 'constant', substrateGPerL: 10 }
		});
		expect(chemostat.feedStreams).toBeNull();
	});
});

describe('feeds validation names the field', () => {
	const good: FeedInput = { strategy: 'constant', substrateGPerL: 200, rateLPerH: 0.01 };
	const water: FeedInput = { strategy: 'constant', substrateGPerL: 0, rateLPerH: 0.01 };

	function fieldOf(request: SimulationRequest): string | undefined {
		return errorOf(() => simulateRun(request)).field;
	}

	it('refuses feed and feeds together', () => {
		const e = errorOf(() => simulateRun({ ...fedBatch([good]), feed: good }));
		expect(e.field).toBe('feeds');
		expect(e.message).toMatch(/either one feed or several feed streams, not both/);
	});

	it.each(['batch', 'chemostat', 'perfusion', 'drawFill'] as const)(
		'refuses feeds in %s mode',
		(mode) => {
			const e = errorOf(() => simulateRun({ ...fedBatch([good]), mode }));
			expect(e.field).toBe('feeds');
			expect(e.message).toMatch(/Several feed streams are used only in fed-batch mode/);
		}
	);

	it('takes 1 to 8 streams', () => {
		expect(fieldOf(fedBatch([]))).toBe('feeds');
		expect(fieldOf(fedBatch(new Array<FeedInput>(MAX_FEED_STREAMS + 1).fill(good)))).toBe('feeds');
		expect(fieldOf(fedBatch(good as unknown as FeedInput[]))).toBe('feeds');
		const eight = simulateRun(
			fedBatch(new Array<FeedInput>(MAX_FEED_STREAMS).fill(good), { endH: 2 })
		);
		expect(streams(eight)).toHaveLength(8);
		// Eight equal streams deliver eight times one (∫ constant, analytic).
		expect(streams(eight).reduce((sum, s) => sum + s.deliveredL, 0)).toBeCloseTo(8 * 0.01 * 2, 12);
	});

	it.each([
		['feeds.1.rateLPerH', [good, { strategy: 'constant', substrateGPerL: 200 }]],
		['feeds.0.strategy', [{ ...good, strategy: 'pulsed' as 'constant' }]],
		['feeds.0.strategy', [{ ...good, strategy: 'toString' as 'constant' }]],
		['feeds.1', [good, null as unknown as FeedInput]],
		['feeds.0.substrateGPerL', [{ ...good, substrateGPerL: -1 }]],
		['feeds.1.startH', [good, { ...good, startH: 20 }]],
		['feeds.0.muSetPerH', [{ ...good, muSetPerH: 0.2 }]],
		['feeds.1.muSetPerH', [good, { strategy: 'exponential', substrateGPerL: 200, muSetPerH: 0.5 }]],
		// exponential and substrate-stat streams divide by S_f − S: they need S_f above the initial S.
		[
			'feeds.1.substrateGPerL',
			[water, { strategy: 'exponential', substrateGPerL: 0, muSetPerH: 0.2 }]
		],
		[
			'feeds.0.substrateGPerL',
			[{ strategy: 'substrateStat', substrateGPerL: 0.8, setpointGPerL: 0.5 }]
		],
		['feeds.0.setpointGPerL', [{ strategy: 'substrateStat', substrateGPerL: 2, setpointGPerL: 3 }]],
		[
			'feeds.0.maxRateLPerH',
			[{ strategy: 'linear', substrateGPerL: 0, rateLPerH: 0.1, slopeLPerH2: 0, maxRateLPerH: 0 }]
		],
		['feeds.0.label', [{ ...good, label: 'x'.repeat(81) }]],
		['feeds.0.label', [{ ...good, label: '   ' }]],
		['feeds.0.label', [{ ...good, label: 7 as unknown as string }]],
		[
			'feeds.1.expression',
			[good, { strategy: 'expression', substrateGPerL: 0, expression: 'volume * 2' }]
		],
		['oxygen', [{ strategy: 'doStat', substrateGPerL: 0, doSetpointMgPerL: 2, maxRateLPerH: 0.1 }]]
	] as const)('%s', (field, feeds) => {
		expect(fieldOf(fedBatch(feeds as unknown as FeedInput[]))).toBe(field);
	});

	it('refuses boluses that together overfill the vessel, naming the one that does', () => {
		const feeds: FeedInput[] = [
			{ ...good, startH: 6, bolusL: 0.4 },
			{ ...water, startH: 2, bolusL: 0.4 }
		];
		// In start order: 1 + 0.4 (feeds.1 at 2 h) + 0.4 (feeds.0 at 6 h) = 1.8 L > 1.7 L.
		expect(fieldOf(fedBatch(feeds, { maxVolumeL: 1.7 }))).toBe('feeds.0.bolusL');
		expect(simulateRun(fedBatch(feeds, { maxVolumeL: 1.8 })).stoppedAtH).toBe(6);
	});

	it('names the stream of a feed expression that fails while running', () => {
		const e = errorOf(() =>
			simulateRun(
				fedBatch([
					good,
					{ strategy: 'expression', substrateGPerL: 0, expression: '0.01 - 0.002 * t' }
				])
			)
		);
		expect(e.field).toBe('feeds.1.expression');
	});

	it('accepts streams without substrate for constant, linear, expression and DO-stat', () => {
		const r = simulateRun(
			fedBatch(
				[
					{ ...water, label: 'x'.repeat(80) },
					{ strategy: 'linear', substrateGPerL: 0, rateLPerH: 0.01, slopeLPerH2: 0.001 },
					{ strategy: 'expression', substrateGPerL: 0, expression: '0.01' },
					{ strategy: 'doStat', substrateGPerL: 0, doSetpointMgPerL: 2, maxRateLPerH: 0.01 }
				],
				{
					kinetics: { ...kinetics, yieldXO2: 1 },
					oxygen: { kLaPerH: 100, saturationMgPerL: 7 },
					endH: 4
				}
			)
		);
		expect(streams(r).map((s) => s.strategy)).toEqual([
			'constant',
			'linear',
			'expression',
			'doStat'
		]);
	});

	it('keeps the single feed’s rules: it still needs substrate, and a label only in fed-batch', () => {
		const { feeds: _, ...rest } = fedBatch([]);
		expect(fieldOf({ ...rest, feed: water })).toBe('feed.substrateGPerL');
		expect(
			fieldOf({
				...rest,
				mode: 'chemostat',
				dilutionPerH: 0.1,
				feed: { strategy: 'constant', substrateGPerL: 10, label: 'Medium' }
			})
		).toBe('feed.label');
		const labelled = simulateRun({ ...rest, feed: { ...good, label: 'Glucose', startH: 1 } });
		expect(labelled.events.find((e) => e.kind === 'feedStarted')?.message).toBe(
			'Feed “Glucose” (constant rate) started.'
		);
	});
});
