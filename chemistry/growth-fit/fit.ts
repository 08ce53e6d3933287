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
import { ChemistryInputError } from '../errors';
import {
	type GrowthCurveData,
	type Estimate,
	type MonodFit,
	type GrowthFit,
	MIN_GROWTH_FIT_POINTS,
	WINDOW_LENGTH_FRACTION,
	POORLY_DETERMINED_FACTOR
} from './types';
import {
	minRSquaredMessage,
	readBiomass,
	readCurvePoints,
	readSeries,
	readSubstrate,
	readTimes
} from './read';
import { fitLine, estimateFrom, formatValue, createEvenGrid } from './regression';
import { findExponentialPhase } from './exponential-phase';
import { describePoorEstimates, fitMonodBatch } from './monod-fit';
export { fitMonodBatchCurve } from './monod-fit';
export { computeMonodBatchSubstrateGPerL } from './monod-batch';
export {
	type GrowthCurveData,
	type Estimate,
	type ParameterEstimate,
	type MonodFit,
	type GrowthFit,
	MIN_GROWTH_FIT_POINTS,
	type MonodBatchParameters,
	type MonodCurveData
} from './types';

export function fitGrowthCurve(data: GrowthCurveData): GrowthFit {
	const { t, x, s, dissolvedOxygen, minPoints, minRSquared, curvePoints } = readGrowthCurve(data);

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

	const whole = fitWholeCurve(data, t, x, s, startIndex, mu.value, yieldXS, curvePoints);
	const { monodFit, warnings } = whole;

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

/** The run data and the fit's settings, each checked. */
function readGrowthCurve(data: GrowthCurveData) {
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
		throw new ChemistryInputError(minRSquaredMessage(), {
			field: 'minRSquared'
		});
	}
	const curvePoints = readCurvePoints(data.curvePoints);
	return { t, x, s, dissolvedOxygen, minPoints, minRSquared, curvePoints };
}

/** The whole-curve Monod fit from the exponential phase's start, with warnings on what it could not do. */
function fitWholeCurve(
	data: GrowthCurveData,
	t: number[],
	x: number[],
	s: number[] | null,
	startIndex: number,
	muMaxGuessPerH: number,
	yieldXS: Estimate | null,
	curvePoints: number
): { monodFit: MonodFit | null; warnings: string[] } {
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
				muMaxGuessPerH,
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
	return { monodFit, warnings };
}
