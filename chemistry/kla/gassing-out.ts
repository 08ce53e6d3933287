/**
 * kLa from a dynamic gassing-out test: after the gas is switched from nitrogen to air the DO rises as
 * C(t) = C* − (C* − C0)·e^(−kLa·(t − t0)) (film theory, dC/dt = kLa·(C* − C)). kLa, C* and C0 are fitted
 * by nonlinear least squares; with a probe time constant τp the probe's own first-order response is
 * fitted instead (./probe-response.ts). Intervals: the linear approximation s²(JᵀJ)⁻¹ with Student's t.
 */
import { SECONDS_PER_HOUR } from '../units';
import { readWholeNumber } from '../input';
import { createEvenGrid } from '../growth-fit/regression';
import type { GassingOutFit, GassingOutInput } from './types';
import {
	readDissolvedOxygen,
	readDissolvedOxygenUnit,
	readProbeTimeConstantS,
	readStartIndex,
	readTimesS
} from './read';
import { computeRemainingDeficitFraction, computeRemainingDeficitSlope } from './probe-response';
import {
	computeCovariance,
	createEstimate,
	refineLeastSquares,
	scaleEstimate,
	sumSquaredResiduals,
	type LeastSquaresModel
} from './least-squares';
import { describeGassingOutWarnings } from './warnings';

export function fitGassingOut(input: GassingOutInput): GassingOutFit {
	const unit = readDissolvedOxygenUnit(input.dissolvedOxygenUnit, 'dissolvedOxygenUnit');
	const timeS = readTimesS(input.timeS, 'timeS');
	const reading = readDissolvedOxygen(input.dissolvedOxygen, 'dissolvedOxygen', timeS.length, unit);
	const probeTimeConstantS = readProbeTimeConstantS(input.probeTimeConstantS, 'probeTimeConstantS');
	const first = readStartIndex(input.startS, 'startS', timeS);
	const curvePoints = readWholeNumber(input.curvePoints ?? 200, 'curvePoints', 2, 10_000);
	const startS = input.startS ?? timeS[0];
	const elapsedS = timeS.slice(first).map((t) => t - startS);
	const observed = reading.slice(first);
	return fitRise(elapsedS, observed, { unit, probeTimeConstantS, startS, curvePoints });
}

interface RiseSettings {
	unit: GassingOutFit['dissolvedOxygenUnit'];
	probeTimeConstantS: number | null;
	startS: number;
	curvePoints: number;
}

/** The fit on elapsed times (s since the rise began) and readings already checked. */
export function fitRise(
	elapsedS: number[],
	observed: number[],
	settings: RiseSettings
): GassingOutFit {
	const { probeTimeConstantS: tau, unit, startS } = settings;
	const n = elapsedS.length;
	const model = createRiseModel(elapsedS, tau);
	const start = findStartingPoint(elapsedS, observed, tau);
	const q = refineLeastSquares(observed, model, [Math.log(start[0]), start[1], start[2]]);
	const [kLaPerS, saturation, initial] = [Math.exp(q[0]), q[1], q[2]];
	const fitted = model.evaluate(q);
	const residuals = observed.map((v, i) => v - fitted[i]);
	const residualSumSquares = sumSquaredResiduals(observed, fitted);
	const degreesOfFreedom = n - 3;
	const residualVariance = residualSumSquares / degreesOfFreedom;
	// The covariance is in kLa itself: the ln kLa column of J times 1/kLa.
	const jacobian = model.jacobian(q).map(([dLnK, dSat, dInit]) => [dLnK / kLaPerS, dSat, dInit]);
	const covariance = computeCovariance(jacobian, residualVariance) ?? [
		[Infinity, 0, 0],
		[0, Infinity, 0],
		[0, 0, Infinity]
	];
	const kLaPerSEstimate = createEstimate(
		kLaPerS,
		Math.sqrt(covariance[0][0]),
		degreesOfFreedom,
		true
	);
	const mean = observed.reduce((a, b) => a + b, 0) / n;
	const totalSumSquares = observed.reduce((a, v) => a + (v - mean) ** 2, 0);
	const curveElapsed = createEvenGrid(0, elapsedS[n - 1], settings.curvePoints);
	const curveValues = model.evaluateAt(q, curveElapsed);
	const fit: GassingOutFit = {
		kLaPerS: kLaPerSEstimate,
		kLaPerH: scaleEstimate(kLaPerSEstimate, SECONDS_PER_HOUR),
		saturation: createEstimate(saturation, Math.sqrt(covariance[1][1]), degreesOfFreedom),
		initial: createEstimate(initial, Math.sqrt(covariance[2][2]), degreesOfFreedom),
		dissolvedOxygenUnit: unit,
		probeTimeConstantS: tau,
		startS,
		pointsUsed: n,
		degreesOfFreedom,
		residuals,
		residualSd: Math.sqrt(residualVariance),
		rSquared: totalSumSquares > 0 ? 1 - residualSumSquares / totalSumSquares : 1,
		curve: { timeS: curveElapsed.map((t) => t + startS), dissolvedOxygen: curveValues },
		covariance,
		warnings: []
	};
	fit.warnings = describeGassingOutWarnings(fit, elapsedS);
	return fit;
}

/** The probe reading C* − (C* − C0)·R for q = [ln kLa, C*, C0], and its gradient in q. */
function createRiseModel(elapsedS: number[], tau: number | null) {
	const evaluateAt = (q: number[], times: number[]) => {
		const k = Math.exp(q[0]);
		return times.map((t) => q[1] - (q[1] - q[2]) * computeRemainingDeficitFraction(k, tau, t));
	};
	const model: LeastSquaresModel & { evaluateAt: typeof evaluateAt } = {
		evaluateAt,
		evaluate: (q) => evaluateAt(q, elapsedS),
		jacobian: (q) => {
			const k = Math.exp(q[0]);
			return elapsedS.map((t) => {
				const r = computeRemainingDeficitFraction(k, tau, t);
				const slope = computeRemainingDeficitSlope(k, tau, t);
				return [-(q[1] - q[2]) * slope * k, 1 - r, r];
			});
		}
	};
	return model;
}

/** C* and C0 by linear least squares for a given kLa (the model is linear in both). */
function solveLevels(
	elapsedS: number[],
	observed: number[],
	kLaPerS: number,
	tau: number | null
): { saturation: number; initial: number; error: number } | null {
	let a11 = 0,
		a12 = 0,
		a22 = 0,
		b1 = 0,
		b2 = 0;
	const r = elapsedS.map((t) => computeRemainingDeficitFraction(kLaPerS, tau, t));
	for (let i = 0; i < r.length; i++) {
		const u = 1 - r[i];
		a11 += u * u;
		a12 += u * r[i];
		a22 += r[i] * r[i];
		b1 += u * observed[i];
		b2 += r[i] * observed[i];
	}
	const det = a11 * a22 - a12 * a12;
	if (!(Math.abs(det) > 1e-12 * a11 * a22)) return null;
	const saturation = (b1 * a22 - b2 * a12) / det;
	const initial = (a11 * b2 - a12 * b1) / det;
	let error = 0;
	for (let i = 0; i < r.length; i++) {
		error += (observed[i] - saturation * (1 - r[i]) - initial * r[i]) ** 2;
	}
	return { saturation, initial, error };
}

/**
 * The best kLa on a logarithmic grid from a tenth of one e-fold over the whole record to ten e-folds
 * per sampling step, C* and C0 solved exactly at each: a start the polish cannot mistake.
 */
function findStartingPoint(
	elapsedS: number[],
	observed: number[],
	tau: number | null
): [number, number, number] {
	const n = elapsedS.length;
	const spanS = elapsedS[n - 1] - elapsedS[0];
	let stepS = spanS;
	for (let i = 1; i < n; i++) stepS = Math.min(stepS, elapsedS[i] - elapsedS[i - 1]);
	const lowest = Math.log(0.1 / spanS);
	const highest = Math.log(10 / stepS);
	let best: [number, number, number] = [1 / spanS, observed[n - 1], observed[0]];
	let bestError = Infinity;
	const count = 120;
	for (let i = 0; i <= count; i++) {
		const k = Math.exp(lowest + ((highest - lowest) * i) / count);
		const levels = solveLevels(elapsedS, observed, k, tau);
		if (levels !== null && levels.error < bestError) {
			bestError = levels.error;
			best = [k, levels.saturation, levels.initial];
		}
	}
	return best;
}
