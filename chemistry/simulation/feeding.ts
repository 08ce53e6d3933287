import { ChemistryInputError } from '../errors';
import {
	C,
	MAX_INFLOW_VOLUMES_PER_H,
	P,
	S,
	V,
	X,
	type FeedLaw,
	type ModelParameters
} from './model';
import type { FeedExpression } from './expression';
import type { FeedPlan } from './validate';

/** Substrate-stat correction rate k = 10·μmax: S settles on the setpoint much faster than X grows. */
export const SUBSTRATE_STAT_GAIN_PER_MU_MAX = 10;
/** DO-stat logistic width w as a fraction of C*; see `createFeedLaw`. */
export const DO_STAT_BAND_FRACTION = 0.01;

/**
 * The feed rate law of a fed-batch strategy. `stateAtStart` is the state at the feed start, after
 * any bolus (the exponential law needs X0·V0 there; a bolus leaves X·V unchanged).
 */
export function createFeedLaw(
	feed: FeedPlan,
	p: ModelParameters,
	stateAtStart: ArrayLike<number>
): FeedLaw {
	const t0 = feed.startH;
	const sf = feed.substrateGPerL;
	const fMax = feed.maxRateLPerH;
	// Keeps laws that divide by S_f − S finite if S ever reaches the feed's own concentration.
	const minGap = 1e-9 * sf;
	switch (feed.strategy) {
		case 'constant': {
			const rate = feed.rateLPerH;
			return () => rate;
		}
		case 'linear': {
			const { rateLPerH: f0, slopeLPerH2: slope } = feed;
			return (tH) => {
				const f = f0 + slope * (tH - t0);
				return f < 0 ? 0 : f > fMax ? fMax : f;
			};
		}
		case 'exponential': {
			// Textbook exponential feed (e.g. Yamane & Shimizu 1984; citation from memory): meets the uptake
			// of a culture growing at μset from X0·V0.
			const { muSetPerH } = feed;
			const demand =
				(muSetPerH / p.yieldXS + p.maintenanceGPerGH) * stateAtStart[X] * stateAtStart[V];
			return (tH, y) => {
				const gap = sf - y[S];
				const f = (demand * Math.exp(muSetPerH * (tH - t0))) / (gap > minGap ? gap : minGap);
				return f > fMax ? fMax : f;
			};
		}
		case 'substrateStat': {
			// Feed-forward of the measured uptake plus a proportional correction: unclamped, it gives
			// dS/dt = k(S_set − S) exactly, so S relaxes to the setpoint without overshoot.
			const gain = SUBSTRATE_STAT_GAIN_PER_MU_MAX * p.muMaxPerH;
			const setpoint = feed.setpointGPerL;
			return (_tH, y, uptakeGPerLH) => {
				const gap = sf - y[S];
				const f =
					((uptakeGPerLH + gain * (setpoint - y[S])) * y[V]) / (gap > minGap ? gap : minGap);
				return f < 0 ? 0 : f > fMax ? fMax : f;
			};
		}
		case 'doStat': {
			// A steep logistic rather than an on/off switch: the integrator needs a smooth right-hand side,
			// and a width of 1 % of C* keeps the controlled DO within a few per cent of C* of the setpoint.
			const setpoint = feed.doSetpointMgPerL;
			const width = DO_STAT_BAND_FRACTION * (p.oxygen?.saturationMgPerL ?? 1);
			return (_tH, y) => fMax / (1 + Math.exp(-(y[C] - setpoint) / width));
		}
		case 'expression':
			return createExpressionFeedLaw(feed.expression, `${feed.field}.expression`, fMax);
	}
}

/**
 * A feed law from the user's expression in t and the states; a failure or a negative or runaway rate
 * stops the run with an error naming the expression's field.
 */
function createExpressionFeedLaw(expression: FeedExpression, field: string, fMax: number): FeedLaw {
	const scope = { t: 0, X: 0, S: 0, P: 0, V: 0, DO: 0, C: 0 };
	return (tH, y) => {
		scope.t = tH;
		scope.X = y[X];
		scope.S = y[S];
		scope.P = y[P];
		scope.V = y[V];
		scope.DO = y[C];
		scope.C = y[C];
		let f: number;
		try {
			f = expression.evaluate(scope);
		} catch (error) {
			if (error instanceof ChemistryInputError) throw error;
			throw new ChemistryInputError(
				`The feed expression failed at t = ${tH.toFixed(3)} h: ${(error as Error).message}`,
				{ field }
			);
		}
		if (!Number.isFinite(f) || f < 0) {
			throw new ChemistryInputError(
				`The feed expression gives ${f} L/h at t = ${tH.toFixed(3)} h; a feed rate must be a finite number ≥ 0 (wrap it in max(0, …) if it may go negative).`,
				{ field }
			);
		}
		const rate = f > fMax ? fMax : f;
		if (rate > MAX_INFLOW_VOLUMES_PER_H * y[V]) {
			throw new ChemistryInputError(
				`The feed expression gives ${rate.toPrecision(3)} L/h at t = ${tH.toFixed(3)} h, more than ${MAX_INFLOW_VOLUMES_PER_H} times the culture volume (${y[V].toPrecision(3)} L) per hour: check its units (L/h) or give feed.maxRateLPerH.`,
				{ field }
			);
		}
		return rate;
	};
}

/** Mixes a volume of added liquid into the culture: X·V and P·V are kept, S moves towards S_f. */
export function applyAddition(
	y: number[],
	addedL: number,
	substrateGPerL: number,
	saturationMgPerL: number | null
): void {
	const v = y[V];
	const total = v + addedL;
	y[X] = (y[X] * v) / total;
	y[S] = (y[S] * v + substrateGPerL * addedL) / total;
	y[P] = (y[P] * v) / total;
	if (saturationMgPerL !== null) y[C] = (y[C] * v + saturationMgPerL * addedL) / total;
	y[V] = total;
}

/** Withdraws a fraction of the culture and refills the same volume with fresh medium. */
export function applyDrawFill(
	y: number[],
	fraction: number,
	substrateGPerL: number,
	saturationMgPerL: number | null
): void {
	const kept = 1 - fraction;
	y[X] *= kept;
	y[S] = kept * y[S] + fraction * substrateGPerL;
	y[P] *= kept;
	if (saturationMgPerL !== null) y[C] = kept * y[C] + fraction * saturationMgPerL;
}
