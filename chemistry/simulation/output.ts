// The run's output series, filled point by point and cut to the points written.
import {
	C,
	computeGrowthRatePerH,
	computeInflowLPerH,
	computeOurMgPerLH,
	O2_MOLAR_MASS_G_PER_MOL,
	P,
	S,
	V,
	X,
	type FlowPhase,
	type ModelParameters,
	type Regime
} from './model';

export interface Output {
	t: number[];
	x: number[];
	s: number[];
	p: number[];
	v: number[];
	c: number[];
	feed: number[];
	/** each fed-batch stream's rate, with several streams (a single stream's is `feed`) */
	streamFeeds: number[][];
	our: number[];
	count: number;
}

/** Series for `n` output points; per-stream rates only with more than one stream. */
export function createOutput(n: number, streamCount: number): Output {
	const series = () => new Array<number>(n);
	return {
		t: series(),
		x: series(),
		s: series(),
		p: series(),
		v: series(),
		c: series(),
		feed: series(),
		// A single stream's rate is the total: copied once at the end rather than at every point.
		streamFeeds: streamCount > 1 ? Array.from({ length: streamCount }, series) : [],
		our: series(),
		count: 0
	};
}

/** Appends an output point from an effective state; `streamRates` is scratch space, one per stream. */
export function appendOutputPoint(
	o: Output,
	p: ModelParameters,
	regime: Regime,
	streamRates: number[],
	tH: number,
	state: ArrayLike<number>,
	phase: FlowPhase,
	evaluatedAtH: number
): void {
	const i = o.count++;
	o.t[i] = tH;
	o.x[i] = clampToZero(state[X]);
	o.s[i] = clampToZero(state[S]);
	o.p[i] = clampToZero(state[P]);
	o.v[i] = state[V];
	o.c[i] = clampToZero(state[C]);
	const mu = computeGrowthRatePerH(p, state, regime);
	if (o.streamFeeds.length === 0) {
		o.feed[i] = computeInflowLPerH(p, phase, evaluatedAtH, state, mu);
	} else {
		streamRates.fill(0);
		o.feed[i] = computeInflowLPerH(p, phase, evaluatedAtH, state, mu, streamRates);
		for (let j = 0; j < streamRates.length; j++) o.streamFeeds[j][i] = streamRates[j];
	}
	o.our[i] = computeOurMgPerLH(p, state, mu) / O2_MOLAR_MASS_G_PER_MOL;
}

/** Cuts every series to the points written (a run that stops early writes fewer); returns their count. */
export function truncateOutput(o: Output): number {
	const n = o.count;
	for (const series of [o.t, o.x, o.s, o.p, o.v, o.c, o.feed, o.our, ...o.streamFeeds]) {
		series.length = n;
	}
	return n;
}

/** Values within the tolerance below zero are rounding, reported as 0 (real failures throw). */
function clampToZero(value: number): number {
	return value < 0 ? 0 : value;
}
