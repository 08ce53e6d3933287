/**
 * Chemostat steady state of a Monod culture without maintenance (Monod 1949; Herbert, Elsworth &
 * Telling 1956, J. Gen. Microbiol. 14:601; citations from memory):
 *   S = Ks·D/(μmax − D),  X = Yx/s·(S0 − S),  productivity D·X,
 *   D_crit = μmax·S0/(Ks + S0)  (above it the culture washes out),
 *   D_opt  = μmax·(1 − √(Ks/(Ks + S0)))  (maximum productivity).
 */
import { ChemistryInputError } from './errors';

export interface MonodChemostatParameters {
	muMaxPerH: number;
	ksGPerL: number;
	yieldXS: number;
	feedSubstrateGPerL: number;
}

export interface ChemostatSteadyStateInput extends MonodChemostatParameters {
	dilutionPerH: number;
	/**
	 * Fraction to stay below D_crit, 0 ≤ margin < 1. The margin operating point is
	 * min((1 − margin)·D_crit, D_opt): no reason to run faster than D_opt, and a real culture near
	 * D_crit washes out on small disturbances.
	 */
	safetyMargin?: number;
	/** points in the sweep from D = 0 to D_crit; default 101 */
	sweepPoints?: number;
}

export interface ChemostatOperatingPoint {
	dilutionPerH: number;
	biomassGPerL: number;
	substrateGPerL: number;
	productivityGPerLH: number;
}

export interface ChemostatSteadyState {
	biomassGPerL: number;
	substrateGPerL: number;
	productivityGPerLH: number;
	criticalDilutionPerH: number;
	optimalDilutionPerH: number;
	washout: boolean;
	sweep: ChemostatOperatingPoint[];
	marginDilutionPerH?: number;
	/** 1 − productivity(margin point)/productivity(D_opt), a fraction */
	productivityLostToMargin?: number;
}

function requirePositive(value: unknown, field: string): number {
	if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
		throw new ChemistryInputError(
			`${field} must be a finite number greater than 0 (got ${String(value)}).`,
			{ field }
		);
	}
	return value;
}

export function validateMonodChemostatParameters(p: MonodChemostatParameters): void {
	requirePositive(p.muMaxPerH, 'muMaxPerH');
	requirePositive(p.ksGPerL, 'ksGPerL');
	requirePositive(p.yieldXS, 'yieldXS');
	requirePositive(p.feedSubstrateGPerL, 'feedSubstrateGPerL');
}

export function computeCriticalDilutionPerH(p: MonodChemostatParameters): number {
	return (p.muMaxPerH * p.feedSubstrateGPerL) / (p.ksGPerL + p.feedSubstrateGPerL);
}

export function computeOptimalDilutionPerH(p: MonodChemostatParameters): number {
	return p.muMaxPerH * (1 - Math.sqrt(p.ksGPerL / (p.ksGPerL + p.feedSubstrateGPerL)));
}

/** Steady state at one dilution rate; at or above D_crit the culture is washed out (X = 0, S = S0). */
export function computeChemostatOperatingPoint(
	p: MonodChemostatParameters,
	dilutionPerH: number
): ChemostatOperatingPoint & { washout: boolean } {
	const s =
		dilutionPerH < p.muMaxPerH
			? (p.ksGPerL * dilutionPerH) / (p.muMaxPerH - dilutionPerH)
			: Infinity;
	if (s >= p.feedSubstrateGPerL) {
		return {
			dilutionPerH,
			biomassGPerL: 0,
			substrateGPerL: p.feedSubstrateGPerL,
			productivityGPerLH: 0,
			washout: true
		};
	}
	const x = p.yieldXS * (p.feedSubstrateGPerL - s);
	return {
		dilutionPerH,
		biomassGPerL: x,
		substrateGPerL: s,
		productivityGPerLH: dilutionPerH * x,
		washout: false
	};
}

export function computeChemostatSteadyState(
	input: ChemostatSteadyStateInput
): ChemostatSteadyState {
	validateMonodChemostatParameters(input);
	const d = input.dilutionPerH;
	if (typeof d !== 'number' || !Number.isFinite(d) || d < 0) {
		throw new ChemistryInputError(`dilutionPerH must be a finite number ≥ 0 (got ${String(d)}).`, {
			field: 'dilutionPerH'
		});
	}
	const sweepPoints = input.sweepPoints ?? 101;
	if (!Number.isInteger(sweepPoints) || sweepPoints < 2 || sweepPoints > 10_000) {
		throw new ChemistryInputError('sweepPoints must be a whole number from 2 to 10000.', {
			field: 'sweepPoints'
		});
	}
	const dCrit = computeCriticalDilutionPerH(input);
	const dOpt = computeOptimalDilutionPerH(input);
	const point = computeChemostatOperatingPoint(input, d);
	const sweep: ChemostatOperatingPoint[] = [];
	for (let i = 0; i < sweepPoints; i++) {
		const p = computeChemostatOperatingPoint(input, (dCrit * i) / (sweepPoints - 1));
		sweep.push({
			dilutionPerH: p.dilutionPerH,
			biomassGPerL: p.biomassGPerL,
			substrateGPerL: p.substrateGPerL,
			productivityGPerLH: p.productivityGPerLH
		});
	}
	const result: ChemostatSteadyState = {
		biomassGPerL: point.biomassGPerL,
		substrateGPerL: point.substrateGPerL,
		productivityGPerLH: point.productivityGPerLH,
		criticalDilutionPerH: dCrit,
		optimalDilutionPerH: dOpt,
		washout: point.washout,
		sweep
	};
	if (input.safetyMargin !== undefined && input.safetyMargin !== null) {
		const margin = input.safetyMargin;
		if (typeof margin !== 'number' || !Number.isFinite(margin) || margin < 0 || margin >= 1) {
			throw new ChemistryInputError(
				`safetyMargin must be a fraction from 0 to below 1 (got ${String(margin)}).`,
				{
					field: 'safetyMargin'
				}
			);
		}
		const dMargin = Math.min((1 - margin) * dCrit, dOpt);
		const best = computeChemostatOperatingPoint(input, dOpt).productivityGPerLH;
		result.marginDilutionPerH = dMargin;
		result.productivityLostToMargin =
			1 - computeChemostatOperatingPoint(input, dMargin).productivityGPerLH / best;
	}
	return result;
}
