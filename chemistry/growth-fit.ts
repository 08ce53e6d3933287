/**
 * Growth parameters from run data.
 *
 * Exponential phase (windowed log-linear regression; searching every window of consecutive points is
 * the usual way to read μ off a semi-log plot, e.g. Hall et al. 2014, Mol. Biol. Evol. 31:232,
 * citation from memory). ln X is regressed on t over every window of at least `minWindowPoints`
 * consecutive points. A window counts as straight when
 *   1. ln X rises (slope > 0) with R² ≥ minRSquared;
 *   2. its residuals are no larger than the measurement noise allows: residual sum of squares within
 *      the 95 % point of χ²(n − 2) times the noise variance (a lack-of-fit test with the noise known
 *      from elsewhere, as in Draper & Smith, Applied Regression Analysis, from memory);
 *   3. it does not bend: adding a quadratic term to the line does not lower the residual sum of squares
 *      by more than the 95 % point of χ²(1) times the noise variance (the extra-sum-of-squares test of
 *      the quadratic term, same source).
 * The fastest growth the data show with confidence is the highest lower 95 % bound of a straight
 * window's slope (the highest slope itself would be a short window's luck in dense noisy data); when
 * it is not above 0 the data show no growth beyond their noise and the fit is refused. The longest
 * straight window growing at least half that fast says how long the exponential phase lasts (the
 * half keeps a long straight slow phase out). Its ends may still hold the last of the lag and the
 * start of the slowdown: bends too gentle for test 3 (which sees curvature far less sharply than the
 * regression sees the slope) still pull the slope below μmax by more than its standard error. So
 * the window reported is the steepest straight window with at least 60 % of the longest one's
 * points. The 60 % is this module's own choice, made by simulation: on Monod batches with a lag
 * whose cultures reach 0.998 μmax, with 2–5 % log-normal noise and a sample every 15 min to 1 h
 * (μmax 0.5 /h), the 95 % interval held μmax in 94–100 % of 200 runs each, where the longest
 * straight window held it in about half (tests/chemistry/growth-fit.test.ts checks 200 runs at 3 %
 * and at 5 % noise). Sums about each window's first point, grown one point at a time, give every
 * window's tests in O(1), so the search over all O(n²) windows stays well under a second at the
 * 5000-point limit. With DO data, points below 5 % of the highest DO recorded are left out (growth
 * there may be O2-limited).
 *
 * The noise of ln X comes from the whole run: each point against the line through its neighbours
 * (pseudo-residuals, Gasser, Sroka & Jennen-Steinmetz 1986, Biometrika 73:625; citation from memory),
 * their median (robust to the few points at a bend) scaled by 1.4826 to a standard deviation. Points
 * whose neighbours carry the very same value (a lag or a plateau read to the instrument's last digit)
 * say nothing about the noise and are left out: counted in, they drive the median to zero whenever
 * more than half the run is flat, and no window then passes. Two floors: the rounding of the numbers
 * as given (a value rounded to steps of h carries a rounding error of variance h²/12, Sheppard's
 * correction, from memory), read from the digits of the data; and 1e-4 in ln X (0.01 %), which
 * stands for model output and other data without measurement noise (no biomass assay repeats to
 * 0.01 %: common practice).
 *
 * μmax is the slope of ln X against t over the window (least squares); its standard error uses the
 * larger of the window's own residual variance and the noise estimate (a window chosen because its
 * residuals are small would otherwise be trusted too much), with Student's t for n − 2 degrees of
 * freedom. Doubling time ln 2/μmax, its interval mapped from μmax's. μmax here is the fastest
 * specific growth rate the culture reached; in a Monod batch it is μmax·S/(Ks + S), so equal to the
 * kinetic μmax only while S ≫ Ks (with Ks/S0 = 1 % the interval is about a rate 1 % below μmax,
 * and at 2–3 % noise on 100 points it is narrower than that), and after a slow end of lag it may
 * never be reached; in such simulations the interval held the fastest rate reached in 80–100 % of
 * runs.
 *
 * Yx/s as −dX/dS, the least-squares slope of X against S over the points with substrate data (the
 * regression form of ΔX/ΔS; exact for a Monod batch without maintenance).
 *
 * μmax, Ks, Yx/s, X0 and S0 fitted to the curve from the exponential phase's first point on (the Monod
 * model has no lag phase) by Levenberg–Marquardt, using the closed-form implicit solution of the Monod
 * batch without maintenance (textbook form, from memory):
 *   μmax·t = (1 + Ks·Y/A)·ln(X/X0) − (Ks·Y/A)·ln(S/S0),  X = A − Y·S,  A = X0 + Y·S0.
 * The closed form is exact and much cheaper than integrating the ODE for every trial parameter set.
 * Residuals are ln X and S/max(S); each block is weighted by its own residual spread from a first,
 * unweighted fit, and the fit repeated. 95 % intervals come from the linear approximation at the
 * optimum: covariance s²(JᵀJ)⁻¹ of the log-parameters, s² the weighted residual variance, with
 * Student's t for 2m − p degrees of freedom (Bates & Watts 1988, Nonlinear Regression Analysis and
 * Its Applications, ch. 2, from memory); the interval of ln θ mapped back to θ stays positive and
 * may be asymmetric. A parameter the model does not respond to at the optimum (its column of J
 * vanishes, as for Ks driven towards 0 when the substrate runs out between two samples) is not
 * determined: its interval is unbounded, and the others come from the remaining columns. An interval
 * wider than a factor of 3 (this module's threshold) or unbounded is reported as a warning in plain
 * words: a batch curve often pins Ks down poorly. The procedure agrees with an independent scipy fit
 * of the integrated ODE to ~1e-8 (tests/chemistry/reference/growth-curves.py). In 50 simulated runs
 * at 3 % noise the intervals held the true μmax in 49, Ks in 44 and Yx/s in 45: the linear
 * approximation runs slightly narrow for Ks and Yx/s.
 */
import { CholeskyDecomposition, Matrix, inverse } from 'ml-matrix';
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { ChemistryInputError } from './errors';
import { readWholeNumber } from './input';
import {
	computeChiSquareQuantile,
	computeStudentTQuantile,
	createStudentT975Table
} from './statistics';

export interface GrowthCurveData {
	timeH: number[];
	biomassGPerL: number[];
	substrateGPerL?: number[];
	dissolvedOxygenMgPerL?: number[];
	/** fewest points in the exponential window; default and least MIN_GROWTH_FIT_POINTS (4) */
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

/** A whole-curve parameter: its interval comes from ln θ, so the standard error is θ·SE(ln θ). */
export interface ParameterEstimate {
	value: number;
	/** null where the data do not determine the parameter */
	standardError: number | null;
	/** 95 % confidence bounds; null where the interval is unbounded */
	lower95: number | null;
	upper95: number | null;
	/** the interval spans more than a factor of 3, or is unbounded */
	poorlyDetermined: boolean;
}

export interface MonodFit {
	muMaxPerH: number;
	ksGPerL: number;
	yieldXS: number;
	/** X and S at `startH`, where the fit begins (the exponential phase's first point) */
	initialBiomassGPerL: number;
	initialSubstrateGPerL: number;
	startH: number;
	biomassRmsGPerL: number;
	substrateRmsGPerL: number;
	iterations: number;
	estimates: {
		muMaxPerH: ParameterEstimate;
		ksGPerL: ParameterEstimate;
		/** null when Yx/s was held at the −dX/dS estimate */
		yieldXS: ParameterEstimate | null;
	};
	/** residual degrees of freedom of the intervals: 2·points − parameters */
	degreesOfFreedom: number;
	curve: { t: number[]; biomassGPerL: number[]; substrateGPerL: number[] };
}

export interface GrowthFit {
	exponentialPhase: {
		startIndex: number;
		endIndex: number;
		startH: number;
		endH: number;
		pointCount: number;
		rSquared: number;
		/** points in the longest straight window, of which the reported one holds at least 60 % */
		longestStraightPointCount: number;
		/** measurement noise of ln X used by the window tests (standard deviation) */
		noiseSdLn: number;
		muMaxPerH: Estimate;
		doublingTimeH: Estimate;
		curve: { t: number[]; biomassGPerL: number[] };
	};
	/** indices left out of the exponential-phase search for low DO */
	oxygenLimitedIndices: number[];
	yieldXS: Estimate | null;
	/** null without substrate data (Ks cannot be told apart from Yx/s on biomass alone) or when the fit failed (see warnings) */
	monodFit: MonodFit | null;
	/** plain-words cautions about the results: poorly determined parameters, a failed whole-curve fit */
	warnings: string[];
}

const MAX_POINTS = 5000;
/** Fewest points a growth fit accepts (the default shortest exponential window). */
export const MIN_GROWTH_FIT_POINTS = 4;
/** Fraction of the longest straight window's points the reported window keeps (see the top of this file). */
const WINDOW_LENGTH_FRACTION = 0.6;
/** Noise floor of ln X for data without measurement noise (see the top of this file). */
const NOISE_FLOOR_LN = 1e-4;
/** An interval spanning more than this factor marks a whole-curve parameter as poorly determined. */
const POORLY_DETERMINED_FACTOR = 3;
interface LineFit {
	slope: number;
	intercept: number;
	/** from the window's own residuals */
	slopeStandardError: number;
	rSquared: number;
	n: number;
	/** Σ(x − x̄)² */
	spreadX: number;
	residualSumSquares: number;
}

/** Ordinary least squares y = a + b·x, two-pass (centred sums). */
function fitLine(x: number[], y: number[]): LineFit {
	const n = x.length;
	let mx = 0,
		my = 0;
	for (let i = 0; i < n; i++) {
		mx += x[i];
		my += y[i];
	}
	mx /= n;
	my /= n;
	let sxx = 0,
		sxy = 0,
		syy = 0;
	for (let i = 0; i < n; i++) {
		const a = x[i] - mx;
		const b = y[i] - my;
		sxx += a * a;
		sxy += a * b;
		syy += b * b;
	}
	const slope = sxy / sxx;
	const residual = Math.max(0, syy - slope * sxy);
	return {
		slope,
		intercept: my - slope * mx,
		slopeStandardError: n > 2 ? Math.sqrt(residual / (n - 2) / sxx) : Infinity,
		rSquared: syy > 0 ? 1 - residual / syy : 1,
		n,
		spreadX: sxx,
		residualSumSquares: residual
	};
}

function estimateFrom(value: number, standardError: number, df: number): Estimate {
	const half = computeStudentTQuantile(0.975, df) * standardError;
	return { value, standardError, lower95: value - half, upper95: value + half };
}

function readSeries(values: unknown, field: string, length: number | null): number[] {
	if (!Array.isArray(values))
		throw new ChemistryInputError(`${field} must be an array of numbers.`, {
			field
		});
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

function readTimes(values: unknown, minPoints: number): number[] {
	const t = readSeries(values, 'timeH', null);
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
				{ field: `timeH.${i}` }
			);
		}
	}
	return t;
}

function readBiomass(values: unknown, length: number): number[] {
	const x = readSeries(values, 'biomassGPerL', length);
	x.forEach((v, i) => {
		if (v <= 0) {
			throw new ChemistryInputError(
				`biomassGPerL[${i}] is ${v}; biomass must be above 0 to take its logarithm.`,
				{ field: `biomassGPerL.${i}` }
			);
		}
	});
	return x;
}

function readSubstrate(values: unknown, length: number): number[] {
	const s = readSeries(values, 'substrateGPerL', length);
	s.forEach((v, i) => {
		if (v < 0) {
			throw new ChemistryInputError(
				`substrateGPerL[${i}] is ${v}; a concentration cannot be negative.`,
				{ field: `substrateGPerL.${i}` }
			);
		}
	});
	return s;
}

function readCurvePoints(value: number | undefined): number {
	return readWholeNumber(value ?? 200, 'curvePoints', 2, 10_000);
}

/** Three significant digits for messages. */
function formatValue(value: number): string {
	return Number(value.toPrecision(3)).toString();
}

export function fitGrowthCurve(data: GrowthCurveData): GrowthFit {
	const minPoints = data.minWindowPoints ?? MIN_GROWTH_FIT_POINTS;
	if (!Number.isInteger(minPoints) || minPoints < MIN_GROWTH_FIT_POINTS) {
		throw new ChemistryInputError(
			`minWindowPoints must be a whole number ≥ ${MIN_GROWTH_FIT_POINTS}.`,
			{
				field: 'minWindowPoints'
			}
		);
	}
	const t = readTimes(data.timeH, minPoints);
	const x = readBiomass(data.biomassGPerL, t.length);
	if (x.every((v) => v === x[0])) {
		throw new ChemistryInputError(
			`Biomass is ${x[0]} g/L at every point: the culture did not grow, so there is nothing to fit.`,
			{ field: 'biomassGPerL' }
		);
	}
	const s =
		data.substrateGPerL === undefined || data.substrateGPerL === null
			? null
			: readSubstrate(data.substrateGPerL, t.length);
	const dissolvedOxygen =
		data.dissolvedOxygenMgPerL === undefined || data.dissolvedOxygenMgPerL === null
			? null
			: readSeries(data.dissolvedOxygenMgPerL, 'dissolvedOxygenMgPerL', t.length);
	const minRSquared = data.minRSquared ?? 0.98;
	if (!(minRSquared > 0 && minRSquared < 1)) {
		throw new ChemistryInputError('minRSquared must be between 0 and 1.', {
			field: 'minRSquared'
		});
	}
	const curvePoints = readCurvePoints(data.curvePoints);

	const oxygenLimitedIndices: number[] = [];
	if (dissolvedOxygen !== null) {
		const limit = 0.05 * Math.max(...dissolvedOxygen);
		dissolvedOxygen.forEach((c, i) => {
			if (c < limit) oxygenLimitedIndices.push(i);
		});
	}
	const phase = findExponentialPhase(t, x, minPoints, minRSquared, new Set(oxygenLimitedIndices));
	const { startIndex, endIndex } = phase;
	const windowT = t.slice(startIndex, endIndex + 1);
	const line = fitLine(
		windowT,
		windowT.map((_, k) => Math.log(x[startIndex + k]))
	);
	const df = line.n - 2;
	// The larger of the window's own residual variance and the noise estimate (see the top of this file).
	const slopeVariance =
		Math.max(line.residualSumSquares / df, phase.meanNoiseVariance) / line.spreadX;
	const mu = estimateFrom(line.slope, Math.sqrt(slopeVariance), df);
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
		const yieldLine = fitLine(s, x);
		if (Number.isFinite(yieldLine.slope) && yieldLine.slope < 0 && s.length > 2) {
			yieldXS = estimateFrom(-yieldLine.slope, yieldLine.slopeStandardError, s.length - 2);
		}
	}

	const warnings: string[] = [];
	let monodFit: MonodFit | null = null;
	if (s !== null) {
		if (s[startIndex] <= 0) {
			warnings.push(
				`The whole-curve Monod fit starts where the exponential phase does (${formatValue(t[startIndex])} h), and the substrate is 0 there, so it was not made.`
			);
		} else {
			monodFit = fitMonodBatch(
				t.slice(startIndex),
				x.slice(startIndex),
				s.slice(startIndex),
				mu.value,
				yieldXS?.value ?? null,
				data.fitYield ?? true,
				curvePoints
			);
			warnings.push(
				...(monodFit === null
					? [
							'The whole-curve Monod fit found no parameters that describe these data from any of its starting points; only the exponential-phase μmax and the −dX/dS yield are given.'
						]
					: describePoorEstimates(monodFit))
			);
		}
	}

	return {
		exponentialPhase: {
			startIndex,
			endIndex,
			startH: t[startIndex],
			endH: t[endIndex],
			pointCount: line.n,
			rSquared: line.rSquared,
			longestStraightPointCount: phase.longestStraightPointCount,
			noiseSdLn: phase.noiseSdLn,
			muMaxPerH: mu,
			doublingTimeH,
			curve: {
				t: windowCurveT,
				biomassGPerL: windowCurveT.map((ti) => Math.exp(line.intercept + line.slope * ti))
			}
		},
		oxygenLimitedIndices,
		yieldXS,
		monodFit,
		warnings
	};
}

function describePoorEstimates(fit: MonodFit): string[] {
	const rows: [string, string, ParameterEstimate | null, string][] = [
		['μmax', '1/h', fit.estimates.muMaxPerH, ''],
		[
			'Ks',
			'g/L',
			fit.estimates.ksGPerL,
			' A batch shows Ks only in the last hour or so before the substrate runs out; more samples there narrow it.'
		],
		['Yx/s', 'g/g', fit.estimates.yieldXS, '']
	];
	const warnings: string[] = [];
	for (const [label, unit, estimate, advice] of rows) {
		if (estimate === null || !estimate.poorlyDetermined) continue;
		if (estimate.lower95 === null || estimate.upper95 === null) {
			warnings.push(
				`${label} is not determined by these data: its 95 % interval is unbounded, so the value ${formatValue(estimate.value)} ${unit} means little.${advice}`
			);
		} else {
			warnings.push(
				`${label} is poorly determined by these data: its 95 % interval runs from ${formatValue(estimate.lower95)} to ${formatValue(estimate.upper95)} ${unit}, more than a factor of ${POORLY_DETERMINED_FACTOR} wide.${advice}`
			);
		}
	}
	return warnings;
}

interface ExponentialPhaseWindow {
	startIndex: number;
	endIndex: number;
	longestStraightPointCount: number;
	noiseSdLn: number;
	/** mean over the window of each point's noise variance (ln units) */
	meanNoiseVariance: number;
}

function findExponentialPhase(
	t: number[],
	x: number[],
	minPoints: number,
	minRSquared: number,
	excluded: Set<number>
): ExponentialPhaseWindow {
	const n = t.length;
	const lnX = x.map(Math.log);
	const noiseSdLn = Math.max(estimateNoiseSdLn(t, lnX, excluded), NOISE_FLOOR_LN);
	const roundingSdLn = estimateRoundingSdLn(x);
	const noiseVariance = roundingSdLn.map((r) => Math.max(noiseSdLn, r) ** 2);
	const chiSquare95 = Array.from({ length: n }, (_, k) =>
		k > 0 ? computeChiSquareQuantile(0.95, k) : 0
	);
	const studentT975 = createStudentT975Table(n);
	const maxCurvatureDrop = computeChiSquareQuantile(0.95, 1);

	// For each length, the steepest straight window of that length (where it starts, its slope).
	const steepestByLength = new Float64Array(n + 1).fill(-Infinity);
	const steepestStartByLength = new Int32Array(n + 1).fill(-1);
	// The fastest growth the data show with confidence: the highest lower 95 % bound of a straight
	// window's slope. (The highest slope itself would be a short window's luck in dense noisy data.)
	let fastestLowerBound = -Infinity;
	// What the best window did at each test, to say why when none passes all of them.
	let anyRising = false;
	const closest: ClosestWindows = { rSquared: null, lackOfFit: null, curvature: null };

	// Sums about each window's first point, grown one point at a time: O(n²) windows, each in O(1),
	// and without the cancellation that sums about a fixed origin suffer in the cubic and quartic terms.
	for (let i = 0; i + minPoints <= n; i++) {
		if (excluded.has(i)) continue;
		let u1 = 0,
			u2 = 0,
			u3 = 0,
			u4 = 0,
			v1 = 0,
			v2 = 0,
			uv = 0,
			u2v = 0,
			noiseSum = 0;
		for (let j = i; j < n; j++) {
			if (excluded.has(j)) break;
			const u = t[j] - t[i];
			const v = lnX[j] - lnX[i];
			const uu = u * u;
			u1 += u;
			u2 += uu;
			u3 += uu * u;
			u4 += uu * uu;
			v1 += v;
			v2 += v * v;
			uv += u * v;
			u2v += uu * v;
			noiseSum += noiseVariance[j];
			const m = j - i + 1;
			if (m < minPoints) continue;
			const suu = u2 - (u1 * u1) / m;
			const suv = uv - (u1 * v1) / m;
			const slope = suv / suu;
			if (!(slope > 0)) continue;
			anyRising = true;
			const svv = v2 - (v1 * v1) / m;
			const residualSumSquares = Math.max(0, svv - slope * suv);
			const rSquared = svv > 0 ? 1 - residualSumSquares / svv : 0;
			if (rSquared < minRSquared) {
				if (closest.rSquared === null || rSquared > closest.rSquared.value) {
					closest.rSquared = { value: rSquared, i, j };
				}
				continue;
			}
			const meanNoiseVariance = noiseSum / m;
			const lackOfFitRatio = residualSumSquares / (chiSquare95[m - 2] * meanNoiseVariance);
			if (lackOfFitRatio > 1) {
				if (closest.lackOfFit === null || lackOfFitRatio < closest.lackOfFit.value) {
					const rms = Math.sqrt(residualSumSquares / (m - 2));
					closest.lackOfFit = { value: lackOfFitRatio, i, j, rms };
				}
				continue;
			}
			// The quadratic term made orthogonal to the line: q = u² less its projection on 1 and u.
			const sww = u4 - (u2 * u2) / m;
			const swu = u3 - (u2 * u1) / m;
			const swv = u2v - (u2 * v1) / m;
			const sqq = sww - (swu * swu) / suu;
			const sqv = swv - (swu * suv) / suu;
			const curvatureDrop = sqq > 0 ? Math.min(residualSumSquares, (sqv * sqv) / sqq) : 0;
			if (curvatureDrop > maxCurvatureDrop * meanNoiseVariance) {
				const z = Math.sqrt(curvatureDrop / meanNoiseVariance);
				if (closest.curvature === null || z < closest.curvature.value) {
					closest.curvature = { value: z, i, j };
				}
				continue;
			}
			const slopeVariance = Math.max(residualSumSquares / (m - 2), meanNoiseVariance) / suu;
			const lowerBound = slope - studentT975[m - 2] * Math.sqrt(slopeVariance);
			if (lowerBound > fastestLowerBound) fastestLowerBound = lowerBound;
			if (slope > steepestByLength[m]) {
				steepestByLength[m] = slope;
				steepestStartByLength[m] = i;
			}
		}
	}

	if (fastestLowerBound === -Infinity) {
		throw new ChemistryInputError(
			explainNoExponentialPhase(
				t,
				minPoints,
				minRSquared,
				noiseSdLn,
				anyRising,
				closest,
				excluded.size
			),
			{ field: 'biomassGPerL' }
		);
	}
	if (!(fastestLowerBound > 0)) {
		// Straight runs exist, but none rises by more than the noise alone could draw.
		throw new ChemistryInputError(
			`No exponential phase found: no straight run of ${minPoints} or more points rises by more than the noise could by chance; the highest lower 95 % bound of a slope is ${formatValue(fastestLowerBound)} /h, not above 0.`,
			{ field: 'biomassGPerL' }
		);
	}
	let longest = 0;
	for (let length = n; length >= minPoints; length--) {
		if (steepestByLength[length] >= 0.5 * fastestLowerBound) {
			longest = length;
			break;
		}
	}
	const shortest = Math.max(minPoints, Math.ceil(WINDOW_LENGTH_FRACTION * longest));
	let chosenLength = longest;
	for (let length = longest; length >= shortest; length--) {
		if (steepestByLength[length] > steepestByLength[chosenLength]) chosenLength = length;
	}
	const startIndex = steepestStartByLength[chosenLength];
	const endIndex = startIndex + chosenLength - 1;
	let windowNoiseVariance = 0;
	for (let k = startIndex; k <= endIndex; k++) windowNoiseVariance += noiseVariance[k];
	return {
		startIndex,
		endIndex,
		longestStraightPointCount: longest,
		noiseSdLn,
		meanNoiseVariance: windowNoiseVariance / chosenLength
	};
}

interface ClosestWindows {
	rSquared: null | { value: number; i: number; j: number };
	lackOfFit: null | { value: number; i: number; j: number; rms: number };
	curvature: null | { value: number; i: number; j: number };
}

function explainNoExponentialPhase(
	t: number[],
	minPoints: number,
	minRSquared: number,
	noiseSdLn: number,
	anyRising: boolean,
	closest: ClosestWindows,
	excludedCount: number
): string {
	const lead = 'No exponential phase found: ';
	const span = (w: { i: number; j: number }) =>
		`${w.j - w.i + 1} points from ${formatValue(t[w.i])} to ${formatValue(t[w.j])} h`;
	const doNote = excludedCount
		? ` (${excludedCount} points with DO below 5 % of its highest were left out)`
		: '';
	if (!anyRising) {
		return `${lead}ln(biomass) does not rise over any ${minPoints} or more consecutive points${doNote}.`;
	}
	if (closest.curvature !== null) {
		const w = closest.curvature;
		return `${lead}every run of ${minPoints} or more points that lies on a line within the noise still bends (test of a quadratic term, 5 % level). The straightest, ${span(w)}, bends with z = ${formatValue(w.value)} where a straight line is kept up to 1.96${doNote}.`;
	}
	if (closest.lackOfFit !== null) {
		const w = closest.lackOfFit;
		return `${lead}every rising run of ${minPoints} or more points with R² ≥ ${minRSquared} scatters about its line more than the measurement noise allows (lack-of-fit test, 95 %). The closest, ${span(w)}, has a residual standard deviation of ${formatValue(w.rms)} in ln(biomass) where the noise estimated from the whole run is ${formatValue(noiseSdLn)}${doNote}.`;
	}
	const w = closest.rSquared!;
	return `${lead}no run of ${minPoints} or more points has ln(biomass) rising on a line with R² ≥ ${minRSquared}. The best, ${span(w)}, has R² = ${w.value.toFixed(3)}${doNote}.`;
}

/**
 * Measurement noise of y (see the top of this file): pseudo-residuals, each point against the line
 * through its neighbours, scaled to unit variance, their median times 1.4826 (the median absolute
 * value of a normal variable over its standard deviation). Triples carrying one value are left out.
 */
function estimateNoiseSdLn(t: number[], y: number[], excluded: Set<number>): number {
	const scaled: number[] = [];
	for (let i = 1; i < t.length - 1; i++) {
		if (excluded.has(i - 1) || excluded.has(i) || excluded.has(i + 1)) continue;
		if (y[i - 1] === y[i] && y[i] === y[i + 1]) continue;
		const a = (t[i + 1] - t[i]) / (t[i + 1] - t[i - 1]);
		const b = 1 - a;
		const residual = y[i] - a * y[i - 1] - b * y[i + 1];
		scaled.push(Math.abs(residual) / Math.sqrt(1 + a * a + b * b));
	}
	if (scaled.length === 0) return 0;
	scaled.sort((p, q) => p - q);
	const mid = scaled.length >> 1;
	const median = scaled.length % 2 ? scaled[mid] : 0.5 * (scaled[mid - 1] + scaled[mid]);
	return 1.4826 * median;
}

/**
 * Rounding error of each ln X from the digits the data are given with: the step of the last digit,
 * read two ways because a trailing zero does not survive as a number (0.050 reads as 0.05): the most
 * significant digits any value carries (data rounded to significant digits) and the most decimals any
 * value carries (data rounded to fixed decimals); the larger step of the two at each value. Its
 * standard deviation is step/√12 (Sheppard's correction), over X for ln X. Numbers that went through
 * a unit conversion are matched to within 1e-9 of their value.
 */
function estimateRoundingSdLn(x: number[]): number[] {
	const matches = (value: number, rounded: string) =>
		Math.abs(Number(rounded) - value) <= 1e-9 * Math.abs(value);
	let significantDigits = 1;
	let decimals = 0;
	for (const value of x) {
		let p = 1;
		while (p < 15 && !matches(value, value.toPrecision(p))) p++;
		significantDigits = Math.max(significantDigits, p);
		let d = 0;
		while (d < 15 && !matches(value, value.toFixed(d))) d++;
		decimals = Math.max(decimals, d);
	}
	return x.map((value) => {
		const exponent = Math.floor(Math.log10(value));
		const step = Math.max(10 ** (exponent - significantDigits + 1), 10 ** -decimals);
		return step / Math.sqrt(12) / value;
	});
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

export interface MonodCurveData {
	timeH: number[];
	biomassGPerL: number[];
	substrateGPerL: number[];
	/** starting value for μmax, e.g. the exponential-phase slope */
	muMaxGuessPerH: number;
	/** starting value for Yx/s, and its value when fitYield is false; default ΔX/ΔS end to end */
	yieldXSGuess?: number | null;
	/** fit Yx/s (default) or hold it at yieldXSGuess */
	fitYield?: boolean;
	/** points in the fitted curves; default 200 */
	curvePoints?: number;
}

/**
 * The whole-curve Monod batch fit alone (see the top of this file), from the first point given;
 * `fitGrowthCurve` calls it from the start of the exponential phase. Null when no start converges.
 */
export function fitMonodBatchCurve(data: MonodCurveData): MonodFit | null {
	const t = readTimes(data.timeH, 3);
	const x = readBiomass(data.biomassGPerL, t.length);
	const s = readSubstrate(data.substrateGPerL, t.length);
	if (s[0] <= 0) {
		throw new ChemistryInputError('substrateGPerL[0] must be above 0 to fit a Monod batch.', {
			field: 'substrateGPerL.0'
		});
	}
	if (!(data.muMaxGuessPerH > 0 && Number.isFinite(data.muMaxGuessPerH))) {
		throw new ChemistryInputError('muMaxGuessPerH must be a number above 0.', {
			field: 'muMaxGuessPerH'
		});
	}
	const yieldGuess = data.yieldXSGuess ?? null;
	if (yieldGuess !== null && !(yieldGuess > 0 && Number.isFinite(yieldGuess))) {
		throw new ChemistryInputError('yieldXSGuess must be a number above 0.', {
			field: 'yieldXSGuess'
		});
	}
	return fitMonodBatch(
		t,
		x,
		s,
		data.muMaxGuessPerH,
		yieldGuess,
		data.fitYield ?? true,
		readCurvePoints(data.curvePoints)
	);
}

function fitMonodBatch(
	t: number[],
	x: number[],
	s: number[],
	muGuess: number,
	yieldGuess: number | null,
	fitYield: boolean,
	curvePoints: number
): MonodFit | null {
	const n = t.length;
	const x0 = x[0];
	const s0 = s[0];
	const parameterCount = fitYield ? 5 : 4;
	if (2 * n <= parameterCount) return null;
	const y0 = yieldGuess ?? Math.max(1e-6, (x[n - 1] - x[0]) / Math.max(1e-12, s[0] - s[n - 1]));
	// Biomass residuals are taken on ln X (biomass measurements, e.g. optical density, err roughly in
	// proportion to the value); substrate residuals are absolute, over the largest substrate value (S
	// is measured near zero after exhaustion, where a relative error means nothing).
	const scaleS = Math.max(...s);
	const observed = [...x.map(Math.log), ...s.map((v) => v / scaleS)];

	// Parameters are fitted as logarithms: they stay positive, the damping treats parameters that
	// differ by orders of magnitude alike, and the intervals of ln θ map back to positive ones.
	const toParameters = (q: ArrayLike<number>): MonodBatchParameters => ({
		muMaxPerH: Math.exp(q[0]),
		ksGPerL: Math.exp(q[1]),
		initialBiomassGPerL: Math.exp(q[2]),
		initialSubstrateGPerL: Math.exp(q[3]),
		yieldXS: fitYield ? Math.exp(q[4]) : y0
	});
	// Unweighted model values and gradients for all points; the library asks for one point at a time,
	// so each parameter set is evaluated once.
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
	const indices = observed.map((_, i) => i);
	/** Weighted least squares by scaling each block (X, then S) by 1/its residual spread. */
	const fitWeighted = (weights: [number, number], starts: number[][]) => {
		const weightOf = (index: number) => (index < n ? weights[0] : weights[1]);
		const weightedObserved = observed.map((v, i) => v * weightOf(i));
		const model = (q: number[]) => {
			const { values } = evaluateAll(q);
			return (index: number) => values[index] * weightOf(index);
		};
		const jacobian = (q: number[]) => {
			const { gradients } = evaluateAll(q);
			return (index: number) => gradients[index].map((g) => g * weightOf(index));
		};
		const errorAt = (q: number[]) => {
			const { values } = evaluateAll(q);
			let error = 0;
			for (let i = 0; i < 2 * n; i++) error += ((observed[i] - values[i]) * weightOf(i)) ** 2;
			return error;
		};
		let best: { q: number[]; error: number; iterations: number } | null = null;
		for (const start of starts) {
			let q = start;
			let error = errorAt(start);
			let iterations = 0;
			// Rounds of 10 iterations, ending when a round gains less than 1e-10 of the error: the
			// library stops only at an absolute error or its iteration limit, and noisy data never
			// reach the one, so each fit would run to the other.
			for (let round = 0; round < 10; round++) {
				let result: { parameterValues: number[]; iterations: number };
				try {
					result = levenbergMarquardt({ x: indices, y: weightedObserved }, model, {
						initialValues: q,
						jacobianFunction: jacobian,
						damping: 1e-2,
						maxIterations: 10,
						errorTolerance: 1e-14,
						minValues: start.map((v) => v - 20),
						maxValues: start.map((v) => v + 20)
					});
				} catch {
					// A singular normal matrix (a parameter the data do not determine): keep what was reached.
					break;
				}
				iterations += result.iterations;
				const next = errorAt(result.parameterValues);
				if (!Number.isFinite(next)) break;
				const gain = error - next;
				if (next < error) {
					q = result.parameterValues;
					error = next;
				}
				if (!(gain > 1e-10 * error)) break;
			}
			if (Number.isFinite(error) && (best === null || error < best.error)) {
				best = { q, error, iterations };
			}
		}
		return best;
	};

	// Ks is weakly determined by a batch curve; a few starting values avoid a poor local minimum.
	const starts = [0.01, 0.1, 1].map((f) => {
		const start = [Math.log(muGuess), Math.log(f * s0), Math.log(x0), Math.log(s0)];
		if (fitYield) start.push(Math.log(y0));
		return start;
	});
	const first = fitWeighted([1, 1], starts);
	if (first === null) return null;
	const blockSd = (q: number[]): [number, number] => {
		const { values } = evaluateAll(q);
		let ssX = 0;
		let ssS = 0;
		for (let i = 0; i < n; i++) {
			ssX += (observed[i] - values[i]) ** 2;
			ssS += (observed[n + i] - values[n + i]) ** 2;
		}
		// The floor keeps noise-free data (model output) from an infinite weight.
		return [Math.max(Math.sqrt(ssX / n), 1e-9), Math.max(Math.sqrt(ssS / n), 1e-9)];
	};
	const [sdX, sdS] = blockSd(first.q);
	const weights: [number, number] = [1 / sdX, 1 / sdS];
	const best = fitWeighted(weights, [first.q]) ?? first;
	const iterations = first.iterations + (best === first ? 0 : best.iterations);

	const p = toParameters(best.q);
	const degreesOfFreedom = 2 * n - parameterCount;
	const { values: fitted, gradients } = evaluateAll(best.q);
	let weightedResidualSumSquares = 0;
	for (let i = 0; i < 2 * n; i++) {
		weightedResidualSumSquares +=
			((observed[i] - fitted[i]) * (i < n ? weights[0] : weights[1])) ** 2;
	}
	const logParameterSd = computeLogParameterStandardErrors(
		gradients.map((g, i) => g.map((d) => d * (i < n ? weights[0] : weights[1]))),
		weightedResidualSumSquares / degreesOfFreedom
	);
	const tQuantile = computeStudentTQuantile(0.975, degreesOfFreedom);
	const estimateOf = (k: number, value: number): ParameterEstimate => {
		const sdLn = logParameterSd?.[k] ?? NaN;
		const lower = value * Math.exp(-tQuantile * sdLn);
		const upper = value * Math.exp(tQuantile * sdLn);
		// A parameter pushed to the edge of the search box is not located by the data at all.
		const atSearchEdge = Math.abs(best.q[k] - first.q[k]) >= 20 - 1e-9;
		const bounded = Number.isFinite(sdLn) && lower > 0 && Number.isFinite(upper) && !atSearchEdge;
		return {
			value,
			standardError: bounded ? value * sdLn : null,
			lower95: bounded ? lower : null,
			upper95: bounded ? upper : null,
			poorlyDetermined: !bounded || upper / lower > POORLY_DETERMINED_FACTOR
		};
	};

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
		muMaxPerH: p.muMaxPerH,
		ksGPerL: p.ksGPerL,
		yieldXS: p.yieldXS,
		initialBiomassGPerL: p.initialBiomassGPerL,
		initialSubstrateGPerL: p.initialSubstrateGPerL,
		startH: t[0],
		biomassRmsGPerL: Math.sqrt(ssX / n),
		substrateRmsGPerL: Math.sqrt(ssS / n),
		iterations,
		estimates: {
			muMaxPerH: estimateOf(0, p.muMaxPerH),
			ksGPerL: estimateOf(1, p.ksGPerL),
			yieldXS: fitYield ? estimateOf(4, p.yieldXS) : null
		},
		degreesOfFreedom,
		curve: {
			t: curveT,
			biomassGPerL: curveS.map((si) => a - p.yieldXS * si),
			substrateGPerL: curveS
		}
	};
}

/**
 * √diag(s²(JᵀJ)⁻¹), the standard errors of the log-parameters in the linear approximation at the
 * optimum (see the top of this file). A parameter the model does not respond to there (its column of
 * J vanishes, as for Ks driven towards 0 when the substrate runs out between two samples) is not
 * determined: Infinity, and the others come from the remaining columns. Null when even those leave
 * JᵀJ singular.
 */
function computeLogParameterStandardErrors(
	weightedJacobian: number[][],
	residualVariance: number
): number[] | null {
	const jacobian = new Matrix(weightedJacobian);
	const columnNorms = Array.from({ length: jacobian.columns }, (_, k) =>
		jacobian.getColumnVector(k).norm()
	);
	const largest = Math.max(...columnNorms);
	const kept = columnNorms.flatMap((norm, k) => (norm > 1e-8 * largest ? [k] : []));
	const reduced = jacobian.subMatrixColumn(kept);
	const normal = reduced.transpose().mmul(reduced);
	if (!new CholeskyDecomposition(normal).isPositiveDefinite()) return null;
	const covariance = inverse(normal).mul(residualVariance);
	const standardErrors = new Array<number>(jacobian.columns).fill(Infinity);
	kept.forEach((k, r) => (standardErrors[k] = Math.sqrt(covariance.get(r, r))));
	return standardErrors;
}

/** Plain-words description of the fit for the page (the subset of Markdown the help component reads). */
export const GROWTH_FIT_HELP = `## The exponential phase and μmax

During the exponential phase the natural logarithm of biomass rises on a straight line against time, and the slope of that line is the specific growth rate. The fit tries every run of at least ${MIN_GROWTH_FIT_POINTS} consecutive points (regression of ln X on time) and keeps the runs that are **straight**:

- ln X rises, with R² of at least 0.98;
- the points scatter about the line no more than the measurement noise allows (a lack-of-fit test at 95 %);
- the line does not bend: adding a curvature (quadratic) term does not improve the fit by more than noise would (a significance test at 5 %).

When no run passes, or none rises by more than the noise could by chance, nothing is fitted and the message names the test that failed and the run that came closest.

The measurement noise is read from the whole run: each point is compared with the line through its two neighbours. Stretches where the reading does not change at all (a lag or a plateau printed to the instrument's last digit) are left out of that estimate, and the noise is never taken below the rounding of the numbers in the file.

The longest straight run says how long the exponential phase lasted. Its ends may still hold the end of the lag and the start of the slowdown, bends too gentle to show point by point but enough to pull the slope down. So the result is the **steepest** straight run holding at least ${WINDOW_LENGTH_FRACTION * 100} % of the longest one's points. With DO data, points below 5 % of the highest DO are left out, as growth there may be oxygen-limited.

μmax is the slope over that run, with a 95 % interval from Student's t; the doubling time is ln 2 / μmax. In a batch this is the fastest rate the culture reached: it equals the kinetic μmax only while the substrate is far above Ks.

## Yield and the whole-curve fit

Yx/s is −ΔX/ΔS, the least-squares slope of biomass against substrate.

With a substrate column the Monod batch model (no maintenance) is fitted to biomass and substrate together, from the first point of the exponential phase on (the model has no lag). Its 95 % intervals come from the curvature of the fit at its best point (the usual linear approximation, on the logarithms of the parameters, so they stay positive). When an interval spans more than a factor of ${POORLY_DETERMINED_FACTOR}, or has no bound, the result names the parameter as poorly determined: a batch curve often pins Ks down poorly, because Ks shows only in the short time before the substrate runs out.`;
