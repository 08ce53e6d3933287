// The Monod batch in closed form (substrate from an implicit equation) and its parameter gradient.
import { type MonodBatchParameters } from './types';

/**
 * ln(S/S0) of a Monod batch without maintenance at time t, from the implicit closed form (see the
 * top of this file), by safeguarded Newton iteration. Working in u = ln(S/S0) keeps late times, when S
 * underflows, well defined.
 */
function solveMonodBatchLogSubstrate(p: MonodBatchParameters, tH: number): number {
	const {
		muMaxPerH: mu,
		ksGPerL: ks,
		yieldXS: y,
		initialBiomassGPerL: x0,
		initialSubstrateGPerL: s0
	} = p;
	if (tH <= 0) return 0;
	const ys0 = y * s0;
	const k = (ks * y) / (x0 + ys0);
	const target = mu * tH;
	// X/X0 = 1 − (Y·S0/X0)·(e^u − 1), written with expm1 for accuracy near u = 0.
	const g = (u: number) => (1 + k) * Math.log1p((-ys0 * Math.expm1(u)) / x0) - k * u - target;
	// g(0) = −μt < 0 and g falls with u; its log term is ≥ 0, so g(u) > 0 below u = −μt/k.
	let lo = -target / k - 1;
	let hi = 0;
	// Start from the exponential-growth estimate S ≈ S0 − X0(e^{μt} − 1)/Y.
	let u = Math.log(Math.max(1e-300, 1 - (x0 * Math.expm1(target)) / ys0));
	if (!(u > lo && u < hi)) u = 0.5 * (lo + hi);
	for (let i = 0; i < 200; i++) {
		const value = g(u);
		if (value > 0) lo = u;
		else hi = u;
		const e = ys0 * Math.exp(u);
		const slope = (-(1 + k) * e) / (x0 + ys0 - e) - k;
		let next = u - value / slope;
		if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
		const done = Math.abs(next - u) <= 1e-14 * Math.max(1, Math.abs(u));
		u = next;
		if (done || hi - lo <= 1e-15 * Math.max(1, Math.abs(u))) break;
	}
	return u;
}

/** Substrate of a Monod batch without maintenance at time t (closed form, see the top of this file). */
export function computeMonodBatchSubstrateGPerL(p: MonodBatchParameters, tH: number): number {
	return p.initialSubstrateGPerL * Math.exp(solveMonodBatchLogSubstrate(p, tH));
}

/**
 * X and S at time t and their derivatives with respect to ln μmax, ln Ks, ln X0, ln S0, ln Y, by
 * implicit differentiation of G(S; θ) = (1 + k)·ln(X/X0) − k·ln(S/S0) − μmax·t = 0.
 */
export function evaluateMonodBatchWithGradient(
	p: MonodBatchParameters,
	tH: number
): { x: number; s: number; dX: number[]; dS: number[] } {
	const {
		muMaxPerH: mu,
		ksGPerL: ks,
		yieldXS: y,
		initialBiomassGPerL: x0,
		initialSubstrateGPerL: s0
	} = p;
	const u = solveMonodBatchLogSubstrate(p, tH);
	const s = s0 * Math.exp(u);
	const a = x0 + y * s0;
	const x = x0 - y * s0 * Math.expm1(u);
	const k = (ks * y) / a;
	const logRatio = Math.log1p((-y * s0 * Math.expm1(u)) / x0) - u; // ln(X/X0) − ln(S/S0)
	// ∂G/∂θ for θ = μmax, Ks, X0, S0, Y (S held fixed); S·∂G/∂S keeps S → 0 finite.
	const partials = [
		-tH,
		(y / a) * logRatio,
		((-ks * y) / (a * a)) * logRatio + (1 + k) * (1 / x - 1 / x0),
		((-ks * y * y) / (a * a)) * logRatio + ((1 + k) * y) / x + k / s0,
		((ks * x0) / (a * a)) * logRatio + ((1 + k) * (s0 - s)) / x
	];
	const sTimesDgDs = (-(1 + k) * y * s) / x - k;
	// ∂X/∂θ with S held fixed, from X = X0 + Y(S0 − S).
	const direct = [0, 0, 1, y, s0 - s];
	const values = [mu, ks, x0, s0, y];
	const dS = new Array<number>(5);
	const dX = new Array<number>(5);
	for (let j = 0; j < 5; j++) {
		const dSdTheta = (-s * partials[j]) / sTimesDgDs;
		dS[j] = values[j] * dSdTheta;
		dX[j] = values[j] * (direct[j] - y * dSdTheta);
	}
	return { x, s, dX, dS };
}
