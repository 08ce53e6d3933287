/**
 * Chemostat steady state of a Monod culture (Monod 1949; Herbert, Elsworth & Telling 1956,
 * J. Gen. Microbiol. 14:601; citations from memory) with Pirt's maintenance (Pirt 1965, "The
 * maintenance energy of bacteria in growing cultures", Proc. R. Soc. Lond. B 163:224–231):
 * substrate is taken up for growth at μ/Y_G and for maintenance at m_s, whatever the growth rate.
 * At steady state μ = D, and the two balances give
 *   S = Ks·D/(μmax − D)                      (from μ(S) = D; maintenance does not enter),
 *   X = D·Y_G·(S0 − S)/(D + m_s·Y_G)         (from D·(S0 − S) = (D/Y_G + m_s)·X),
 *   productivity D·X,
 *   D_crit = μmax·S0/(Ks + S0)                (S reaches S0: washout; unchanged by m_s, which draws
 *                                             substrate but does not slow growth).
 * Y_G is the true growth yield; the observed yield X/(S0 − S) = Y_G·D/(D + m_s·Y_G) is lower at low D.
 * Without maintenance X = Y_G·(S0 − S) and D_opt = μmax·(1 − √(Ks/(Ks + S0))) in closed form.
 * With maintenance there is no such short form: P = Y_G·D²·(S0·(μmax − D) − Ks·D)/((μmax − D)(D + m_s·Y_G)),
 * and the numerator of dP/dD is D times a cubic in D. Cardano's formula would solve the cubic, but
 * picking the right one of its three roots and its cancellation as m_s → 0 make that fragile, so D_opt
 * is found by golden-section search on P over (0, D_crit). That search is sound because ln P is concave there:
 * 2·ln D − ln(D + m_s·Y_G) and ln(S0 − S(D)) are each concave, so P has a single maximum.
 */
import { isGiven, NON_NEGATIVE, POSITIVE, readNumber, readWholeNumber, type Bounds } from './input';

/** Pirt's m_s, g substrate / g biomass / h: none is 0. */
export const MAINTENANCE_BOUNDS: Bounds = NON_NEGATIVE;
/** The fraction to stay below D_crit: 0 ≤ margin < 1. */
export const SAFETY_MARGIN_BOUNDS: Bounds = { min: 0, minInclusive: true, max: 1 };
export const MIN_SWEEP_POINTS = 2;
export const MAX_SWEEP_POINTS = 10_000;

export interface MonodChemostatParameters {
	muMaxPerH: number;
	ksGPerL: number;
	/** true growth yield Y_G, g biomass / g substrate */
	yieldXS: number;
	feedSubstrateGPerL: number;
	/** Pirt's maintenance coefficient m_s, g substrate / g biomass / h; default 0 */
	maintenanceGPerGH?: number;
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

export function validateMonodChemostatParameters(p: MonodChemostatParameters): void {
	readNumber(p.muMaxPerH, 'muMaxPerH', POSITIVE);
	readNumber(p.ksGPerL, 'ksGPerL', POSITIVE);
	readNumber(p.yieldXS, 'yieldXS', POSITIVE);
	readNumber(p.feedSubstrateGPerL, 'feedSubstrateGPerL', POSITIVE);
	if (isGiven(p.maintenanceGPerGH))
		readNumber(p.maintenanceGPerGH, 'maintenanceGPerGH', MAINTENANCE_BOUNDS);
}

export function computeCriticalDilutionPerH(p: MonodChemostatParameters): number {
	return (p.muMaxPerH * p.feedSubstrateGPerL) / (p.ksGPerL + p.feedSubstrateGPerL);
}

/** Golden-section steps stop once the bracket is this fraction of D_crit (≈ 58 steps). */
const OPTIMUM_BRACKET_FRACTION = 1e-12;

/**
 * The x of the largest f on [lo, hi] for a unimodal f, by golden-section search. Written here rather
 * than taken from a package: the project has no bounded 1-D optimiser (mathjs has none), and the
 * method is a dozen lines. Accuracy is limited by how flat f is at its top: about √ε·(hi − lo).
 */
function maximiseUnimodal(
	f: (x: number) => number,
	lo: number,
	hi: number,
	tolerance: number
): number {
	const invPhi = (Math.sqrt(5) - 1) / 2;
	let a = lo;
	let b = hi;
	let c = b - invPhi * (b - a);
	let d = a + invPhi * (b - a);
	let fc = f(c);
	let fd = f(d);
	while (b - a > tolerance) {
		if (fc >= fd) {
			b = d;
			d = c;
			fd = fc;
			c = b - invPhi * (b - a);
			fc = f(c);
		} else {
			a = c;
			c = d;
			fc = fd;
			d = a + invPhi * (b - a);
			fd = f(d);
		}
	}
	return (a + b) / 2;
}

export function computeOptimalDilutionPerH(p: MonodChemostatParameters): number {
	const m = p.maintenanceGPerGH ?? 0;
	if (m === 0) return p.muMaxPerH * (1 - Math.sqrt(p.ksGPerL / (p.ksGPerL + p.feedSubstrateGPerL)));
	const dCrit = computeCriticalDilutionPerH(p);
	return maximiseUnimodal(
		(d) => computeChemostatOperatingPoint(p, d).productivityGPerLH,
		0,
		dCrit,
		OPTIMUM_BRACKET_FRACTION * dCrit
	);
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
	const m = p.maintenanceGPerGH ?? 0;
	// Share of the uptake that goes to growth, (D/Y_G)/(D/Y_G + m_s); exactly 1 without maintenance.
	const growthShare = m === 0 ? 1 : dilutionPerH / (dilutionPerH + m * p.yieldXS);
	const x = p.yieldXS * (p.feedSubstrateGPerL - s) * growthShare;
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
	const d = readNumber(input.dilutionPerH, 'dilutionPerH', NON_NEGATIVE);
	const sweepPoints = readWholeNumber(
		input.sweepPoints ?? 101,
		'sweepPoints',
		MIN_SWEEP_POINTS,
		MAX_SWEEP_POINTS
	);
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
		const margin = readNumber(input.safetyMargin, 'safetyMargin', SAFETY_MARGIN_BOUNDS);
		const dMargin = Math.min((1 - margin) * dCrit, dOpt);
		const best = computeChemostatOperatingPoint(input, dOpt).productivityGPerLH;
		result.marginDilutionPerH = dMargin;
		result.productivityLostToMargin =
			1 - computeChemostatOperatingPoint(input, dMargin).productivityGPerLH / best;
	}
	return result;
}
