/**
 * The distributions the science tests against: χ² (consistency of a redundant balance, lack of fit of a
 * regression window) and Student's t (confidence intervals of fitted parameters).
 *
 * Written here rather than taken from a statistics package: for the integer degrees of freedom the
 * science uses, both CDFs have short closed forms (a finite or fast-converging series), so a few dozen
 * lines give results exact to rounding with no dependency; tests/chemistry/statistics.test.ts checks
 * them against SciPy (tests/chemistry/reference/statistics.py) and printed table values.
 */
import { ChemistryInputError } from './errors';

/** Upper 2.5 % point of the standard normal distribution, z(0.975) (standard normal table). */
const NORMAL_QUANTILE_975 = 1.959964;

/** ln Γ(a) for integer or half-integer a > 0, exactly from factorials. */
function computeLnGammaOfHalfInteger(a: number): number {
	let lnGamma = 0;
	if (Number.isInteger(a)) {
		for (let k = 2; k < a; k++) lnGamma += Math.log(k);
	} else {
		lnGamma = 0.5 * Math.log(Math.PI);
		for (let k = 0.5; k < a; k += 1) lnGamma += Math.log(k);
	}
	return lnGamma;
}

/** Regularised lower incomplete gamma P(a, h) by its power series, with ln Γ(a) given. */
function computeLowerGammaRatio(a: number, h: number, lnGamma: number): number {
	if (h <= 0) return 0;
	if (h > a + 40 * Math.sqrt(a) + 100) return 1;
	let term = 1 / a;
	let sum = term;
	for (let n = 1; n < 100000; n++) {
		term *= h / (a + n);
		sum += term;
		if (term < sum * 1e-16) break;
	}
	return Math.min(1, sum * Math.exp(-h + a * Math.log(h) - lnGamma));
}

function checkDegreesOfFreedom(degreesOfFreedom: number): void {
	if (!Number.isInteger(degreesOfFreedom) || degreesOfFreedom < 1) {
		throw new ChemistryInputError('degreesOfFreedom must be a whole number ≥ 1.', {
			field: 'degreesOfFreedom'
		});
	}
}

/** χ² CDF for integer degrees of freedom: the regularised lower incomplete gamma P(ν/2, x/2). */
export function computeChiSquareCdf(x: number, degreesOfFreedom: number): number {
	checkDegreesOfFreedom(degreesOfFreedom);
	const a = degreesOfFreedom / 2;
	return computeLowerGammaRatio(a, x / 2, computeLnGammaOfHalfInteger(a));
}

/**
 * χ² quantile for integer degrees of freedom: Newton's method on the CDF (its derivative is the
 * density), kept inside a bisection bracket so that every step narrows it; converged to 1e-12 relative.
 */
export function computeChiSquareQuantile(probability: number, degreesOfFreedom: number): number {
	const validDegrees = Number.isInteger(degreesOfFreedom) && degreesOfFreedom >= 1;
	if (!(probability > 0 && probability < 1) || !validDegrees) {
		throw new ChemistryInputError(
			'χ² quantile needs 0 < probability < 1 and integer degrees of freedom ≥ 1'
		);
	}
	const a = degreesOfFreedom / 2;
	const lnGamma = computeLnGammaOfHalfInteger(a);
	const cdf = (x: number) => computeLowerGammaRatio(a, x / 2, lnGamma);
	const density = (x: number) => 0.5 * Math.exp((a - 1) * Math.log(x / 2) - x / 2 - lnGamma);
	let lo = 0;
	let hi = degreesOfFreedom + 10;
	while (cdf(hi) < probability) {
		lo = hi;
		hi *= 2;
	}
	// start at the mean, ν, where it lies inside the bracket
	let x = degreesOfFreedom > lo && degreesOfFreedom < hi ? degreesOfFreedom : (lo + hi) / 2;
	for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
		const excess = cdf(x) - probability;
		if (excess < 0) lo = x;
		else hi = x;
		const slope = density(x);
		const next = slope > 0 && Number.isFinite(slope) ? x - excess / slope : NaN;
		if (!(next > lo && next < hi)) {
			x = (lo + hi) / 2;
			continue;
		}
		if (Math.abs(next - x) <= 1e-14 * x) return next;
		x = next;
	}
	return (lo + hi) / 2;
}

/**
 * Student's t quantile for integer degrees of freedom: the closed-form CDF (Abramowitz & Stegun 1964,
 * 26.7.3 and 26.7.4; equation numbers from memory) inverted by bisection, so it is exact to rounding.
 * Regression windows are short, and at 2–10 degrees of freedom the normal quantile would understate a
 * 95 % interval by 10–55 %.
 */
export function computeStudentTQuantile(probability: number, degreesOfFreedom: number): number {
	if (!(probability > 0 && probability < 1)) {
		throw new ChemistryInputError('probability must be between 0 and 1.', {
			field: 'probability'
		});
	}
	checkDegreesOfFreedom(degreesOfFreedom);
	if (probability === 0.5) return 0;
	if (probability < 0.5) return -computeStudentTQuantile(1 - probability, degreesOfFreedom);
	// Beyond 10⁵ degrees of freedom the quantile changes by < 1e-5 relative; cap the series length.
	const nu = Math.min(degreesOfFreedom, 100_000);
	const target = 2 * probability - 1;
	let lo = 0;
	let hi = Math.PI / 2;
	for (let i = 0; i < 200 && hi - lo > 1e-16; i++) {
		const mid = 0.5 * (lo + hi);
		if (computeTwoSidedTProbability(mid, nu) < target) lo = mid;
		else hi = mid;
	}
	return Math.sqrt(nu) * Math.tan(0.5 * (lo + hi));
}

/** A(t|ν) = P(|T| ≤ t) as a function of θ = atan(t/√ν) (Abramowitz & Stegun 1964, from memory). */
function computeTwoSidedTProbability(theta: number, nu: number): number {
	const c = Math.cos(theta);
	const s = Math.sin(theta);
	const c2 = c * c;
	if (nu % 2 === 1) {
		if (nu === 1) return (2 / Math.PI) * theta;
		let term = c;
		let sum = c;
		for (let power = 3, j = 1; power <= nu - 2; power += 2, j++) {
			term *= (c2 * (2 * j)) / (2 * j + 1);
			sum += term;
		}
		return (2 / Math.PI) * (theta + s * sum);
	}
	let term = 1;
	let sum = 1;
	for (let power = 2, j = 1; power <= nu - 2; power += 2, j++) {
		term *= (c2 * (2 * j - 1)) / (2 * j);
		sum += term;
	}
	return s * sum;
}

/**
 * t(0.975, ν) for ν = 0…n (index 0 unused): exact to ν = 100, beyond by the Cornish–Fisher expansion
 * in 1/ν (Abramowitz & Stegun 1964, 26.7.5, from memory; its error there is below 1e-5), because the
 * exact series costs O(ν) per evaluation and a regression over n points needs every ν up to n.
 */
export function createStudentT975Table(n: number): Float64Array {
	const table = new Float64Array(n + 1);
	const z = NORMAL_QUANTILE_975;
	for (let nu = 1; nu <= n; nu++) {
		table[nu] =
			nu <= 100
				? computeStudentTQuantile(0.975, nu)
				: z +
					(z ** 3 + z) / (4 * nu) +
					(5 * z ** 5 + 16 * z ** 3 + 3 * z) / (96 * nu * nu) +
					(3 * z ** 7 + 19 * z ** 5 + 17 * z ** 3 - 15 * z) / (384 * nu ** 3);
	}
	return table;
}
