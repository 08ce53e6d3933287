// The whole-curve Monod fit (Levenberg–Marquardt on log-parameters) described in ./fit.ts.
import { CholeskyDecomposition, Matrix, inverse } from 'ml-matrix';
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { ChemistryInputError } from '../errors';
import { computeStudentTQuantile } from '../statistics';
import {
	type ParameterEstimate,
	type MonodFit,
	POORLY_DETERMINED_FACTOR,
	type MonodBatchParameters,
	type MonodCurveData
} from './types';
import { readTimes, readBiomass, readSubstrate, readCurvePoints } from './read';
import { formatValue, createEvenGrid } from './regression';
import { computeMonodBatchSubstrateGPerL, evaluateMonodBatchWithGradient } from './monod-batch';

export function describePoorEstimates(fit: MonodFit): string[] {
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

export function fitMonodBatch(
	t: number[],
	x: number[],
	s: number[],
	muGuess: number,
	yieldGuess: number | null,
	fitYield: boolean,
	curvePoints: number
): MonodFit | null {
	const n = t.length;
	const parameterCount = fitYield ? 5 : 4;
	if (2 * n <= parameterCount) return null;
	const y0 = yieldGuess ?? Math.max(1e-6, (x[n - 1] - x[0]) / Math.max(1e-12, s[0] - s[n - 1]));
	const problem = createMonodProblem(t, x, s, fitYield, y0);
	const fitWeighted = (weights: [number, number], starts: number[][]) =>
		fitWeightedFromStarts(problem.observed, n, problem.evaluateAll, weights, starts);

	// Ks is weakly determined by a batch curve; a few starting values avoid a poor local minimum.
	const starts = [0.01, 0.1, 1].map((f) => {
		const start = [Math.log(muGuess), Math.log(f * s[0]), Math.log(x[0]), Math.log(s[0])];
		if (fitYield) start.push(Math.log(y0));
		return start;
	});
	const first = fitWeighted([1, 1], starts);
	if (first === null) return null;
	const weights = weightsFromBlockSd(problem, first.q);
	const best = fitWeighted(weights, [first.q]) ?? first;
	const iterations = first.iterations + (best === first ? 0 : best.iterations);

	const p = problem.toParameters(best.q);
	const degreesOfFreedom = 2 * n - parameterCount;
	const estimateOf = createEstimator(problem, weights, first.q, best.q, degreesOfFreedom);
	const { values } = problem.evaluateAll(best.q);
	const { biomassRmsGPerL, substrateRmsGPerL, curve } = describeFittedCurve(
		p,
		{ t, x, s },
		values,
		problem.scaleS,
		curvePoints
	);
	return {
		muMaxPerH: p.muMaxPerH,
		ksGPerL: p.ksGPerL,
		yieldXS: p.yieldXS,
		initialBiomassGPerL: p.initialBiomassGPerL,
		initialSubstrateGPerL: p.initialSubstrateGPerL,
		startH: t[0],
		biomassRmsGPerL,
		substrateRmsGPerL,
		iterations,
		estimates: {
			muMaxPerH: estimateOf(0, p.muMaxPerH),
			ksGPerL: estimateOf(1, p.ksGPerL),
			yieldXS: fitYield ? estimateOf(4, p.yieldXS) : null
		},
		degreesOfFreedom,
		curve
	};
}

/** The model evaluated at every point (ln X then S / scaleS), with its gradients in ln θ. */
type ModelEvaluation = { q: number[]; values: number[]; gradients: number[][] };

/** The observations and the model for one batch curve, in the fit's scaled terms. */
interface MonodProblem {
	n: number;
	scaleS: number;
	/** ln X at each point, then S / scaleS */
	observed: number[];
	toParameters: (q: ArrayLike<number>) => MonodBatchParameters;
	evaluateAll: (q: number[]) => ModelEvaluation;
}

function createMonodProblem(
	t: number[],
	x: number[],
	s: number[],
	fitYield: boolean,
	y0: number
): MonodProblem {
	const n = t.length;
	const parameterCount = fitYield ? 5 : 4;
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
	let cached: ModelEvaluation | null = null;
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
	return { n, scaleS, observed, toParameters, evaluateAll };
}

/** Weights of the biomass and substrate blocks: one over each block's residual standard deviation at q. */
function weightsFromBlockSd(
	{ n, observed, evaluateAll }: MonodProblem,
	q: number[]
): [number, number] {
	const { values } = evaluateAll(q);
	let ssX = 0;
	let ssS = 0;
	for (let i = 0; i < n; i++) {
		ssX += (observed[i] - values[i]) ** 2;
		ssS += (observed[n + i] - values[n + i]) ** 2;
	}
	// The floor keeps noise-free data (model output) from an infinite weight.
	const sdX = Math.max(Math.sqrt(ssX / n), 1e-9);
	const sdS = Math.max(Math.sqrt(ssS / n), 1e-9);
	return [1 / sdX, 1 / sdS];
}

/** Each parameter's estimate with its 95 % interval, from the weighted fit's log-parameter errors. */
function createEstimator(
	{ n, observed, evaluateAll }: MonodProblem,
	weights: [number, number],
	firstQ: number[],
	bestQ: number[],
	degreesOfFreedom: number
): (k: number, value: number) => ParameterEstimate {
	const { values: fitted, gradients } = evaluateAll(bestQ);
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
	return (k, value) => {
		const sdLn = logParameterSd?.[k] ?? NaN;
		const lower = value * Math.exp(-tQuantile * sdLn);
		const upper = value * Math.exp(tQuantile * sdLn);
		// A parameter pushed to the edge of the search box is not located by the data at all.
		const atSearchEdge = Math.abs(bestQ[k] - firstQ[k]) >= 20 - 1e-9;
		const bounded = Number.isFinite(sdLn) && lower > 0 && Number.isFinite(upper) && !atSearchEdge;
		return {
			value,
			standardError: bounded ? value * sdLn : null,
			lower95: bounded ? lower : null,
			upper95: bounded ? upper : null,
			poorlyDetermined: !bounded || upper / lower > POORLY_DETERMINED_FACTOR
		};
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

type ModelValues = { values: number[]; gradients: number[][] };

/**
 * Weighted least squares by scaling each block (X, then S) by 1/its residual spread: the best fit
 * reached from any of the starts.
 */
function fitWeightedFromStarts(
	observed: number[],
	n: number,
	evaluateAll: (q: number[]) => ModelValues,
	weights: [number, number],
	starts: number[][]
): { q: number[]; error: number; iterations: number } | null {
	const indices = observed.map((_, i) => i);
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
		const { q, error, iterations } = refineFromStart(
			{ x: indices, y: weightedObserved },
			model,
			jacobian,
			errorAt,
			start
		);
		if (Number.isFinite(error) && (best === null || error < best.error)) {
			best = { q, error, iterations };
		}
	}
	return best;
}

/** Levenberg–Marquardt from one start, in rounds (see below); keeps the best point reached. */
function refineFromStart(
	data: { x: number[]; y: number[] },
	model: (q: number[]) => (index: number) => number,
	jacobian: (q: number[]) => (index: number) => number[],
	errorAt: (q: number[]) => number,
	start: number[]
): { q: number[]; error: number; iterations: number } {
	let q = start;
	let error = errorAt(start);
	let iterations = 0;
	// Rounds of 10 iterations, ending when a round gains less than 1e-10 of the error: the
	// library stops only at an absolute error or its iteration limit, and noisy data never
	// reach the one, so each fit would run to the other.
	for (let round = 0; round < 10; round++) {
		let result: { parameterValues: number[]; iterations: number };
		try {
			result = levenbergMarquardt(data, model, {
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
	return { q, error, iterations };
}

/** RMS deviations of the fitted curve from the data, and the curve on an even grid. */
function describeFittedCurve(
	p: MonodBatchParameters,
	data: { t: number[]; x: number[]; s: number[] },
	values: number[],
	scaleS: number,
	curvePoints: number
) {
	const { t, x, s } = data;
	const n = t.length;
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
		biomassRmsGPerL: Math.sqrt(ssX / n),
		substrateRmsGPerL: Math.sqrt(ssS / n),
		curve: {
			t: curveT,
			biomassGPerL: curveS.map((si) => a - p.yieldXS * si),
			substrateGPerL: curveS
		}
	};
}
