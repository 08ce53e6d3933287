// The nonlinear least-squares pieces of the kLa fits: a Levenberg–Marquardt polish and the
// linear-approximation covariance s²(JᵀJ)⁻¹ (Bates & Watts 1988, ch. 2; from memory).
import { CholeskyDecomposition, Matrix, inverse } from 'ml-matrix';
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { computeStudentTQuantile } from '../statistics';
import type { Estimate } from './types';

export interface LeastSquaresModel {
	/** the model at every point for parameters p */
	evaluate: (p: number[]) => number[];
	/** ∂model/∂p at every point (one row per point) */
	jacobian: (p: number[]) => number[][];
}

export function sumSquaredResiduals(observed: number[], fitted: number[]): number {
	let sum = 0;
	for (let i = 0; i < observed.length; i++) sum += (observed[i] - fitted[i]) ** 2;
	return sum;
}

/**
 * Levenberg–Marquardt from `start`, in rounds of 20 iterations until a round gains less than 1e-12 of
 * the residual sum of squares: the library stops only at an absolute error or its iteration limit,
 * and noisy data never reach the first. Keeps the best point reached.
 */
export function refineLeastSquares(
	observed: number[],
	model: LeastSquaresModel,
	start: number[]
): number[] {
	const indices = observed.map((_, i) => i);
	let best = start;
	let bestError = sumSquaredResiduals(observed, model.evaluate(start));
	for (let round = 0; round < 10; round++) {
		let next: number[];
		try {
			next = levenbergMarquardt(
				{ x: indices, y: observed },
				(p) => {
					const values = model.evaluate(p);
					return (i) => values[i];
				},
				{
					initialValues: best,
					jacobianFunction: (p) => {
						const rows = model.jacobian(p);
						return (i) => rows[i];
					},
					damping: 1e-3,
					maxIterations: 20,
					errorTolerance: 1e-14
				}
			).parameterValues;
		} catch {
			break; // a singular normal matrix: keep what was reached
		}
		const error = sumSquaredResiduals(observed, model.evaluate(next));
		if (!Number.isFinite(error)) break;
		const gain = bestError - error;
		if (error < bestError) {
			best = next;
			bestError = error;
		}
		if (!(gain > 1e-12 * bestError)) break;
	}
	return best;
}

/** s²(JᵀJ)⁻¹ at the optimum; null when JᵀJ is singular (a parameter the data do not fix). */
export function computeCovariance(
	jacobian: number[][],
	residualVariance: number
): number[][] | null {
	const j = new Matrix(jacobian);
	const normal = j.transpose().mmul(j);
	if (!new CholeskyDecomposition(normal).isPositiveDefinite()) return null;
	return inverse(normal).mul(residualVariance).to2DArray();
}

/** value ± t(0.975, df)·SE; a bound that a positive quantity cannot take is left open (null). */
export function createEstimate(
	value: number,
	standardError: number,
	degreesOfFreedom: number,
	positive = false
): Estimate {
	const half = computeStudentTQuantile(0.975, degreesOfFreedom) * standardError;
	const lower = value - half;
	return {
		value,
		standardError,
		lower95: Number.isFinite(lower) && !(positive && lower <= 0) ? lower : null,
		upper95: Number.isFinite(value + half) ? value + half : null
	};
}

export function scaleEstimate(estimate: Estimate, factor: number): Estimate {
	const scale = (v: number | null) => (v === null ? null : v * factor);
	return {
		value: estimate.value * factor,
		standardError: estimate.standardError * factor,
		lower95: scale(estimate.lower95),
		upper95: scale(estimate.upper95)
	};
}
