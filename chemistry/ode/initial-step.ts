// The first step's size when the caller gives none: Hairer, Nørsett & Wanner, Solving Ordinary
// Differential Equations I (2nd ed., Springer 1993), §II.4 "Starting Step Size", as in their codes.
import type { Derivative } from './types';

function scaledNorm(v: ArrayLike<number>, scale: number[], n: number): number {
	let sum = 0;
	for (let i = 0; i < n; i++) {
		const e = v[i] / scale[i];
		sum += e * e;
	}
	return Math.sqrt(sum / n);
}

/**
 * A first step for a method whose error estimate goes as h^`errorOrder`, from one explicit Euler
 * step: f(t, y) is `f0` (a copy). Uses one evaluation; never more than `maxStep`.
 */
export function chooseInitialStep(
	f: Derivative,
	t: number,
	y: number[],
	f0: number[],
	options: { absoluteTolerance: number; relativeTolerance: number; errorOrder: number },
	maxStep: number,
	work: number[]
): number {
	const n = y.length;
	const scale = new Array<number>(n);
	for (let i = 0; i < n; i++) {
		scale[i] = options.absoluteTolerance + options.relativeTolerance * Math.abs(y[i]);
	}
	const d0 = scaledNorm(y, scale, n);
	const d1 = scaledNorm(f0, scale, n);
	let h0 = d0 < 1e-5 || d1 < 1e-5 ? 1e-6 : 0.01 * (d0 / d1);
	h0 = Math.min(h0, maxStep);
	for (let i = 0; i < n; i++) work[i] = y[i] + h0 * f0[i];
	const f1 = f(t + h0, work);
	let sum = 0;
	for (let i = 0; i < n; i++) {
		const e = (f1[i] - f0[i]) / scale[i];
		sum += e * e;
	}
	const d2 = Math.sqrt(sum / n) / h0;
	const largest = Math.max(d1, d2);
	const h1 =
		largest <= 1e-15 ? Math.max(1e-6, h0 * 1e-3) : Math.pow(0.01 / largest, 1 / options.errorOrder);
	const h = Math.min(100 * h0, h1, maxStep);
	return Number.isFinite(h) && h > 0 ? h : Math.min(1e-6, maxStep);
}
