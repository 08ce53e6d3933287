/**
 * Growth parameters from run data.
 *
 * - Exponential phase: the longest window of consecutive points (at least 4; the faster on a tie) over
 *   which ln X rises on a straight line at least half as steeply as the steepest such window (so not a
 *   plateau or a slow phase): slope > 0, R² ≥ 0.98, and residuals no larger than the
 *   measurement noise allows (residual sum of squares within the 95 % point of χ²(n − 2) times the
 *   noise variance, the noise estimated from the whole run). Picking the window with the largest slope
 *   instead rewards chance: at 2 % noise the steepest short window overstates μmax by 5–30 %. A window
 *   running into the lag or the deceleration phase bends and fails the residual test. With DO data,
 *   points below 5 % of the highest DO recorded are left out (growth there may be O2-limited).
 * - μmax from the slope of ln X against t (least squares), doubling time ln 2/μmax, with 95 %
 *   confidence intervals from Student's t.
 * - Yx/s as −dX/dS, the least-squares slope of X against S over the points with substrate data (the
 *   regression form of ΔX/ΔS; exact for a Monod batch without maintenance).
 * - μmax, Ks, Yx/s, X0 and S0 fitted to the whole curve by Levenberg–Marquardt, using the closed-form
 *   implicit solution of the Monod batch without maintenance (textbook form, from memory):
 *     μmax·t = (1 + Ks·Y/A)·ln(X/X0) − (Ks·Y/A)·ln(S/S0),  X = A − Y·S,  A = X0 + Y·S0.
 *   The closed form is exact and much cheaper than integrating the ODE for every trial parameter set.
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { ChemistryInputError } from './errors';

export interface GrowthCurveData {
	timeH: number[];
	biomassGPerL: number[];
	substrateGPerL?: number[];
	dissolvedOxygenMgPerL?: number[];
	/** fewest points in the exponential window; default 4 */
	minWindowPoints?: number;
	/** default 0.98 */
	minRSquared?: number;
	/** fit Yx/s with the whole curve (default) or hold it at the −dX/dS estimate */
	fitYield?: boolean;
	/** points in the fitted curves; default 200 */
	curvePoints?: number;
}

export interface Estimate {
	value: number;
	standardError: number;
	/** 95 % confidence bounds; null where the interval is unbounded */
	lower95: number | null;
	upper95: number | null;
}

export interface GrowthFit {
	exponentialPhase: {
		startIndex: number;
		endIndex: number;
		startH: number;
		endH: number;
		pointCount: number;
		rSquared: number;
		muMaxPerH: Estimate;
		doublingTimeH: Estimate;
		curve: { t: number[]; biomassGPerL: number[] };
	};
	/** indices left out of the exponential-phase search for low DO */
	oxygenLimitedIndices: number[];
	yieldXS: Estimate | null;
	/** null without substrate data: Ks cannot be told apart from Yx/s on biomass alone */
	monodFit: {
		muMaxPerH: number;
		ksGPerL: number;
		yieldXS: number;
		initialBiomassGPerL: number;
		initialSubstrateGPerL: number;
		biomassRmsGPerL: number;
		substrateRmsGPerL: number;
		iterations: number;
		curve: { t: number[]; biomassGPerL: number[]; substrateGPerL: number[] };
	} | null;
}

const MAX_POINTS = 5000;

/**
 * Student's t quantile for integer degrees of freedom: the closed-form CDF (Abramowitz & Stegun 1964,
 * 26.7.3 and 26.7.4; equation numbers from memory) inverted by bisection, so it is exact to rounding. Regression windows are short,
 * and at 2–10 degrees of freedom the normal quantile would understate a 95 % interval by 10–55 %.
 */
export function computeStudentTQuantile(probability: number, degreesOfFreedom: number): number {
	if (!(probability > 0 && probability < 1)) {
		throw new ChemistryInputError('probability must be between 0 and 1.', { field: 'probability' });
	}
	if (!Number.isInteger(degreesOfFreedom) || degreesOfFreedom < 1) {
		throw new ChemistryInputError('degreesOfFreedom must be a whole number ≥ 1.', {
			field: 'degreesOfFreedom'
		});
	}
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

interface LineFit {
	slope: number;
	intercept: number;
	slopeStandardError: number;
	rSquared: number;
	n: number;
	/** Σ(x − x̄)² */
	spreadX: number;
	residualSumSquares: number;
}

/** Ordinary least squares y = a + b·x from sums about a shift (keeps the sums well conditioned). */
function fitLineFromSums(
	n: number,
	sx: number,
	sy: number,
	sxx: number,
	sxy: number,
	syy: number
): LineFit {
	const mx = sx / n;
	const my = sy / n;
	const ssx = sxx - n * mx * mx;
	const ssy = syy - n * my * my;
	const sxyc = sxy - n * mx * my;
	const slope = sxyc / ssx;
	const residual = Math.max(0, ssy - slope * sxyc);
	const rSquared = ssy > 0 ? 1 - residual / ssy : 1;
	const slopeStandardError = n > 2 ? Math.sqrt(residual / (n - 2) / ssx) : Infinity;
	return {
		slope,
		intercept: my - slope * mx,
		slopeStandardError,
		rSquared,
		n,
		spreadX: ssx,
		residualSumSquares: residual
	};
}

function fitLine(x: number[], y: number[]): LineFit {
	const x0 = x[0];
	const y0 = y[0];
	let sx = 0,
		sy = 0,
		sxx = 0,
		sxy = 0,
		syy = 0;
	for (let i = 0; i < x.length; i++) {
		const a = x[i] - x0;
		const b = y[i] - y0;
		sx += a;
		sy += b;
		sxx += a * a;
		sxy += a * b;
		syy += b * b;
	}
	const fit = fitLineFromSums(x.length, sx, sy, sxx, sxy, syy);
	return { ...fit, intercept: fit.intercept + y0 - fit.slope * x0 };
}

function estimateFrom(value: number, standardError: number, df: number): Estimate {
	const half = computeStudentTQuantile(0.975, df) * standardError;
	return { value, standardError, lower95: value - half, upper95: value + half };
}

function readSeries(values: unknown, field: string, length: number | null): number[] {
	if (!Array.isArray(values))
		throw new ChemistryInputError(`${field} must be an array of numbers.`, { field });
	if (length !== null && values.length !== length) {
		throw new ChemistryInputError(`${field} has ${values.length} values but timeH has ${length}.`, {
			field
		});
	}
	values.forEach((v, i) => {
		if (typeof v !== 'number' || !Number.isFinite(v)) {
			throw new ChemistryInputError(`${field}[${i}] must be a finite number.`, {
				field: `${field}.${i}`
			});
		}
	});
	return values as number[];
}

export function fitGrowthCurve(data: GrowthCurveData): GrowthFit {
	const t = readSeries(data.timeH, 'timeH', null);
	const minPoints = data.minWindowPoints ?? 4;
	if (!Number.isInteger(minPoints) || minPoints < 4) {
		throw new ChemistryInputError('minWindowPoints must be a whole number ≥ 4.', {
			field: 'minWindowPoints'
		});
	}
	if (t.length < minPoints) {
		throw new ChemistryInputError(
			`At least ${minPoints} data points are needed (got ${t.length}).`,
			{ field: 'timeH' }
		);
	}
	if (t.length > MAX_POINTS) {
		throw new ChemistryInputError(
			`At most ${MAX_POINTS} data points are accepted (got ${t.length}).`,
			{ field: 'timeH' }
		);
	}
	for (let i = 1; i < t.length; i++) {
		if (!(t[i] > t[i - 1])) {
			throw new ChemistryInputError(
				`timeH must increase strictly; timeH[${i}] = ${t[i]} follows ${t[i - 1]}.`,
				{
					field: `timeH.${i}`
				}
			);
		}
	}
	const x = readSeries(data.biomassGPerL, 'biomassGPerL', t.length);
	x.forEach((v, i) => {
		if (v <= 0) {
			throw new ChemistryInputError(
				`biomassGPerL[${i}] is ${v}; biomass must be above 0 to take its logarithm.`,
				{
					field: `biomassGPerL.${i}`
				}
			);
		}
	});
	const s =
		data.substrateGPerL === undefined || data.substrateGPerL === null
			? null
			: readSeries(data.substrateGPerL, 'substrateGPerL', t.length);
	s?.forEach((v, i) => {
		if (v < 0) {
			throw new ChemistryInputError(
				`substrateGPerL[${i}] is ${v}; a concentration cannot be negative.`,
				{
					field: `substrateGPerL.${i}`
				}
			);
		}
	});
	const dissolvedOxygen =
		data.dissolvedOxygenMgPerL === undefined || data.dissolvedOxygenMgPerL === null
			? null
			: readSeries(data.dissolvedOxygenMgPerL, 'dissolvedOxygenMgPerL', t.length);
	const minRSquared = data.minRSquared ?? 0.98;
	if (!(minRSquared > 0 && minRSquared < 1)) {
		throw new ChemistryInputError('minRSquared must be between 0 and 1.', { field: 'minRSquared' });
	}
	const curvePoints = data.curvePoints ?? 200;
	if (!Number.isInteger(curvePoints) || curvePoints < 2 || curvePoints > 10_000) {
		throw new ChemistryInputError('curvePoints must be a whole number from 2 to 10000.', {
			field: 'curvePoints'
		});
	}

	const oxygenLimitedIndices: number[] = [];
	if (dissolvedOxygen !== null) {
		const limit = 0.05 * Math.max(...dissolvedOxygen);
		dissolvedOxygen.forEach((c, i) => {
			if (c < limit) oxygenLimitedIndices.push(i);
		});
	}
	const exponentialPhase = findExponentialPhase(
		t,
		x,
		minPoints,
		minRSquared,
		new Set(oxygenLimitedIndices)
	);
	const { fit, startIndex, endIndex } = exponentialPhase;
	const df = fit.n - 2;
	const mu = estimateFrom(fit.slope, fit.slopeStandardError, df);
	const ln2 = Math.LN2;
	const doublingTimeH: Estimate = {
		value: ln2 / mu.value,
		standardError: (ln2 * mu.standardError) / (mu.value * mu.value),
		lower95: mu.upper95 !== null && mu.upper95 > 0 ? ln2 / mu.upper95 : null,
		upper95: mu.lower95 !== null && mu.lower95 > 0 ? ln2 / mu.lower95 : null
	};
	const windowCurveT = createEvenGrid(t[startIndex], t[endIndex], curvePoints);

	let yieldXS: Estimate | null = null;
	if (s !== null) {
		const line = fitLine(s, x);
		if (Number.isFinite(line.slope) && line.slope < 0 && s.length > 2) {
			yieldXS = estimateFrom(-line.slope, line.slopeStandardError, s.length - 2);
		}
	}

	return {
		exponentialPhase: {
			startIndex,
			endIndex,
			startH: t[startIndex],
			endH: t[endIndex],
			pointCount: fit.n,
			rSquared: fit.rSquared,
			muMaxPerH: mu,
			doublingTimeH,
			curve: {
				t: windowCurveT,
				biomassGPerL: windowCurveT.map((ti) => Math.exp(fit.intercept + fit.slope * ti))
			}
		},
		oxygenLimitedIndices,
		yieldXS,
		monodFit:
			s === null
				? null
				: fitMonodBatch(
						t,
						x,
						s,
						mu.value,
						yieldXS?.value ?? null,
						data.fitYield ?? true,
						curvePoints
					)
	};
}

function findExponentialPhase(
	t: number[],
	x: number[],
	minPoints: number,
	minRSquared: number,
	excluded: Set<number>
): { fit: LineFit; startIndex: number; endIndex: number } {
	const n = t.length;
	const lnX = x.map(Math.log);
	// Prefix sums about the first point let every window's regression be read off in O(1).
	const t0 = t[0];
	const y0 = lnX[0];
	const cx = [0],
		cy = [0],
		cxx = [0],
		cxy = [0],
		cyy = [0];
	for (let i = 0; i < n; i++) {
		const a = t[i] - t0;
		const b = lnX[i] - y0;
		cx.push(cx[i] + a);
		cy.push(cy[i] + b);
		cxx.push(cxx[i] + a * a);
		cxy.push(cxy[i] + a * b);
		cyy.push(cyy[i] + b * b);
	}
	// A floor of 1e-6 (ln units) stands for the precision of the data themselves, so exactly
	// exponential data still pass the lack-of-fit test below.
	const noiseVariance = Math.max(estimateNoiseSd(t, lnX, excluded), 1e-6) ** 2;
	// Two passes over the windows: the steepest slope first, then the longest window growing at least
	// half as fast. The half excludes plateaus and slow phases, which in smooth data are also straight.
	const windowFit = (i: number, j: number) =>
		fitLineFromSums(
			j - i + 1,
			cx[j + 1] - cx[i],
			cy[j + 1] - cy[i],
			cxx[j + 1] - cxx[i],
			cxy[j + 1] - cxy[i],
			cyy[j + 1] - cyy[i]
		);
	const forEachWindow = (visit: (i: number, j: number, fit: LineFit) => void) => {
		for (let i = 0; i < n; i++) {
			if (excluded.has(i)) continue;
			for (let j = i + minPoints - 1; j < n; j++) {
				if (excluded.has(j)) break;
				const fit = windowFit(i, j);
				if (fit.slope > 0 && fit.rSquared >= minRSquared) visit(i, j, fit);
			}
		}
	};
	let steepest = 0;
	forEachWindow((_i, _j, fit) => {
		if (fit.slope > steepest) steepest = fit.slope;
	});
	// (Assigned in a callback, which TypeScript's narrowing does not follow; hence the cast.)
	let best = null as { fit: LineFit; startIndex: number; endIndex: number } | null;
	forEachWindow((i, j, fit) => {
		if (fit.slope < 0.5 * steepest) return;
		if (
			best !== null &&
			(fit.n < best.fit.n || (fit.n === best.fit.n && fit.slope <= best.fit.slope))
		)
			return;
		if (fit.residualSumSquares > computeChiSquareQuantile95(fit.n - 2) * noiseVariance) return;
		best = { fit, startIndex: i, endIndex: j };
	});
	if (best === null) {
		throw new ChemistryInputError(
			`No exponential phase found: no run of ${minPoints} or more consecutive points has ln(biomass) rising linearly with R² ≥ ${minRSquared}.`,
			{ field: 'biomassGPerL' }
		);
	}
	// The window sums were taken about the first point; move the intercept back to absolute time.
	const fit = { ...best.fit, intercept: best.fit.intercept + y0 - best.fit.slope * t0 };
	return { fit, startIndex: best.startIndex, endIndex: best.endIndex };
}

/**
 * Upper 5 % point of χ² with k degrees of freedom, by the Wilson–Hilferty cube-root approximation
 * (Wilson & Hilferty 1931; within ~1 % from k = 2, ample for a pass/fail test on noisy data).
 */
function computeChiSquareQuantile95(k: number): number {
	if (k === 1) return 3.841459; // exact: 1.959964² (the cube-root form is poor at k = 1)
	const z = 1.644854; // standard normal 95 % point
	const c = 2 / (9 * k);
	return k * (1 - c + z * Math.sqrt(c)) ** 3;
}

/**
 * Measurement noise of y from pseudo-residuals, each point against the line through its neighbours
 * (Gasser, Sroka & Jennen-Steinmetz 1986, Biometrika 73:625; citation from memory), with a median so
 * the few points at a bend do not count. It stands in for a window's own residual spread, which from
 * four or five points is often small by chance and would let a short window win on luck.
 */
function estimateNoiseSd(t: number[], y: number[], excluded: Set<number>): number {
	const scaled: number[] = [];
	for (let i = 1; i < t.length - 1; i++) {
		if (excluded.has(i - 1) || excluded.has(i) || excluded.has(i + 1)) continue;
		const a = (t[i + 1] - t[i]) / (t[i + 1] - t[i - 1]);
		const b = 1 - a;
		const residual = y[i] - a * y[i - 1] - b * y[i + 1];
		scaled.push(Math.abs(residual) / Math.sqrt(1 + a * a + b * b));
	}
	if (scaled.length === 0) return 0;
	scaled.sort((p, q) => p - q);
	const mid = scaled.length >> 1;
	const median = scaled.length % 2 ? scaled[mid] : 0.5 * (scaled[mid - 1] + scaled[mid]);
	// 1.4826 turns the median absolute value of a normal variable into its standard deviation.
	return 1.4826 * median;
}

function createEvenGrid(a: number, b: number, count: number): number[] {
	return Array.from({ length: count }, (_, i) => a + ((b - a) * i) / (count - 1));
}

export interface MonodBatchParameters {
	muMaxPerH: number;
	ksGPerL: number;
	yieldXS: number;
	initialBiomassGPerL: number;
	initialSubstrateGPerL: number;
}

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
function evaluateMonodBatchWithGradient(
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

function fitMonodBatch(
	t: number[],
	x: number[],
	s: number[],
	muGuess: number,
	yieldGuess: number | null,
	fitYield: boolean,
	curvePoints: number
): GrowthFit['monodFit'] {
	const n = t.length;
	const x0 = x[0];
	const s0 = s[0];
	if (s0 <= 0) {
		throw new ChemistryInputError('substrateGPerL[0] must be above 0 to fit a Monod batch.', {
			field: 'substrateGPerL.0'
		});
	}
	const y0 = yieldGuess ?? Math.max(1e-6, (x[n - 1] - x[0]) / Math.max(1e-12, s[0] - s[n - 1]));
	// Biomass residuals are taken on ln X (biomass measurements, e.g. optical density, err roughly in
	// proportion to the value); substrate residuals are absolute, over the largest substrate value (S
	// is measured near zero after exhaustion, where a relative error means nothing).
	const scaleS = Math.max(...s);
	const observed = [...x.map(Math.log), ...s.map((v) => v / scaleS)];
	const indices = observed.map((_, i) => i);
	const parameterCount = fitYield ? 5 : 4;

	// Parameters are fitted as logarithms: they stay positive, and the damping treats parameters
	// that differ by orders of magnitude alike.
	const toParameters = (q: ArrayLike<number>): MonodBatchParameters => ({
		muMaxPerH: Math.exp(q[0]),
		ksGPerL: Math.exp(q[1]),
		initialBiomassGPerL: Math.exp(q[2]),
		initialSubstrateGPerL: Math.exp(q[3]),
		yieldXS: fitYield ? Math.exp(q[4]) : y0
	});
	// The library asks for one point at a time; each parameter set is evaluated once for all points.
	let cached: { q: number[]; values: number[]; gradients: number[][] } | null = null;
	const evaluateAll = (q: number[]) => {
		if (cached !== null && cached.q.every((v, i) => v === q[i])) return cached;
		const p = toParameters(q);
		const values = new Array<number>(2 * n);
		const gradients = new Array<number[]>(2 * n);
		for (let i = 0; i < n; i++) {
			const r = evaluateMonodBatchWithGradient(p, t[i] - t[0]);
			values[i] = Math.log(r.x);
			values[n + i] = r.s / scaleS;
			gradients[i] = r.dX.slice(0, parameterCount).map((d) => d / r.x);
			gradients[n + i] = r.dS.slice(0, parameterCount).map((d) => d / scaleS);
		}
		cached = { q: q.slice(), values, gradients };
		return cached;
	};
	const model = (q: number[]) => {
		const { values } = evaluateAll(q);
		return (index: number) => values[index];
	};
	const jacobian = (q: number[]) => {
		const { gradients } = evaluateAll(q);
		return (index: number) => gradients[index];
	};
	const errorOf = (q: number[]) => {
		const { values } = evaluateAll(q);
		let sum = 0;
		for (let i = 0; i < 2 * n; i++) sum += (observed[i] - values[i]) ** 2;
		return sum;
	};

	let best: { q: number[]; error: number; iterations: number } | null = null;
	// Ks is weakly determined by a batch curve; a few starting values avoid a poor local minimum.
	for (const ksStart of [0.01, 0.1, 1].map((f) => f * s0)) {
		const start = [Math.log(muGuess), Math.log(ksStart), Math.log(x0), Math.log(s0)];
		if (fitYield) start.push(Math.log(y0));
		let result: { parameterValues: number[]; iterations: number };
		try {
			result = levenbergMarquardt({ x: indices, y: observed }, model, {
				initialValues: start,
				jacobianFunction: jacobian,
				damping: 1e-2,
				maxIterations: 100,
				errorTolerance: 1e-14,
				minValues: start.map((v) => v - 20),
				maxValues: start.map((v) => v + 20)
			});
		} catch {
			// A singular normal matrix (a parameter the data do not determine): try the next start.
			continue;
		}
		const error = errorOf(result.parameterValues);
		if (Number.isFinite(error) && (best === null || error < best.error)) {
			best = { q: result.parameterValues, error, iterations: result.iterations };
		}
	}
	if (best === null) return null;
	const p = toParameters(best.q);
	const { values } = evaluateAll(best.q);
	let ssX = 0;
	let ssS = 0;
	for (let i = 0; i < n; i++) {
		ssX += (x[i] - Math.exp(values[i])) ** 2;
		ssS += (s[i] - values[n + i] * scaleS) ** 2;
	}
	const curveT = createEvenGrid(t[0], t[n - 1], curvePoints);
	const curveS = curveT.map((ti) => computeMonodBatchSubstrateGPerL(p, ti - t[0]));
	const a = p.initialBiomassGPerL + p.yieldXS * p.initialSubstrateGPerL;
	return {
		...p,
		biomassRmsGPerL: Math.sqrt(ssX / n),
		substrateRmsGPerL: Math.sqrt(ssS / n),
		iterations: best.iterations,
		curve: {
			t: curveT,
			biomassGPerL: curveS.map((si) => a - p.yieldXS * si),
			substrateGPerL: curveS
		}
	};
}
