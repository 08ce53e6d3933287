// Finite-difference derivatives of the right-hand side. ∂f/∂y as the Fortran code rodas.f forms it
// (Hairer & Wanner, Solving ODEs II, §IV.7): forward differences with increments √(u·max(10⁻⁵, |yⱼ|)),
// u the unit roundoff. Their error is of order √u·|yⱼ|·|∂²f|, so a state far smaller than 10⁻⁵ with
// a strongly curved rate (Robertson's y₂ at 10⁻¹³ in 3·10⁷·y₂²) calls for an analytic Jacobian.
import type { Derivative } from './types';

const UNIT_ROUNDOFF = Number.EPSILON;

/**
 * Fills `into` (row-major n × n) with ∂f/∂y at (t, y) by forward differences over the first
 * `columns` states (the others are left at zero); `f0` is a copy of f(t, y), not the array f returned
 * (the next call may overwrite it). `y` is perturbed and restored. Returns the evaluations used.
 */
export function differenceJacobian(
	f: Derivative,
	t: number,
	y: number[],
	f0: ArrayLike<number>,
	into: number[],
	n: number,
	columns: number
): number {
	for (let j = 0; j < columns; j++) {
		const held = y[j];
		const delta = Math.sqrt(UNIT_ROUNDOFF * Math.max(1e-5, Math.abs(held)));
		y[j] = held + delta;
		const shifted = f(t, y);
		// The increment actually represented, not the one intended: held + delta rounds.
		const step = y[j] - held;
		y[j] = held;
		for (let i = 0; i < n; i++) into[i * n + j] = (shifted[i] - f0[i]) / step;
	}
	for (let j = columns; j < n; j++) for (let i = 0; i < n; i++) into[i * n + j] = 0;
	return columns;
}

/**
 * Fills `into` with ∂f/∂t at (t, y) by the one-sided difference (−3f(t) + 4f(t + δ) − f(t + 2δ))/(2δ)
 * (two evaluations; `f0` as above), inside [t, t + room]: a right-hand side may hold only from t on
 * (a feed law from its start) and only up to the interval's end. Not rodas.f's first-order forward
 * difference: this one is exact for rates up to quadratic in t, so a volume fed at such a rate is
 * integrated exactly, as an order-4 method should.
 */
export function differenceTimeDerivative(
	f: Derivative,
	t: number,
	y: number[],
	f0: ArrayLike<number>,
	into: number[],
	n: number,
	room: number
): void {
	const delta = Math.min(Math.cbrt(UNIT_ROUNDOFF) * Math.max(1, Math.abs(t)), 0.5 * room);
	const near = t + delta;
	const far = t + 2 * delta;
	const step = near - t;
	const atNear = f(near, y);
	for (let i = 0; i < n; i++) into[i] = 4 * atNear[i] - 3 * f0[i];
	const atFar = f(far, y);
	for (let i = 0; i < n; i++) into[i] = (into[i] - atFar[i]) / (2 * step);
}
