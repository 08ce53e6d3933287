import { describe, expect, it } from 'vitest';
import { RosenbrockSolver, type Derivative, type JacobianFunction } from '../../chemistry/ode';
import { factorLu, solveLu } from '../../chemistry/ode/lu';
// Written by tests/chemistry/reference/stiff-ode.py (SciPy's Radau with the analytic Jacobian):
//   python3 tests/chemistry/reference/stiff-ode.py > tests/chemistry/reference/stiff-ode.json
import reference from './reference/stiff-ode.json';

function relativeError(actual: number, expected: number): number {
	return Math.abs(actual - expected) / Math.abs(expected);
}

/** Robertson (1966), the ROBER problem of the Bari IVP test set (Mazzia & Magherini). */
const robertson: Derivative = (_t, y) => [
	-0.04 * y[0] + 1e4 * y[1] * y[2],
	0.04 * y[0] - 1e4 * y[1] * y[2] - 3e7 * y[1] * y[1],
	3e7 * y[1] * y[1]
];
/** Its Jacobian, row by row (differentiated by hand). */
const robertsonJacobian: JacobianFunction = (_t, y, _f, into) => {
	const rows = [
		[-0.04, 1e4 * y[2], 1e4 * y[1]],
		[0.04, -1e4 * y[2] - 6e7 * y[1], -1e4 * y[1]],
		[0, 6e7 * y[1], 0]
	];
	for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) into[i * 3 + j] = rows[i][j];
	return 0;
};

describe('RODAS on Robertson’s chemical kinetics', () => {
	const solver = new RosenbrockSolver(3, {
		absoluteTolerance: 1e-12,
		relativeTolerance: 1e-8,
		maxSteps: 100_000,
		jacobian: robertsonJacobian
	});

	it('agrees at t = 40 with an independent computation (SciPy Radau, rtol 1e-12)', () => {
		expect(reference.integrator).toMatch(/Radau/);
		const r = solver.solve(robertson, 0, [1, 0, 0], reference.robertson.t);
		expect(r.outcome).toBe('done');
		// Independent computation with SciPy (stiff-ode.json), to 100× the requested tolerance.
		for (let i = 0; i < 3; i++) {
			expect(relativeError(r.y[i], reference.robertson.y[i])).toBeLessThan(1e-6);
		}
		// Rates of order 1e4 /h: an explicit method would need ~1e5 steps for stability alone.
		expect(r.accepted).toBeLessThan(1000);
	});

	it('agrees at t = 1e11 with the Bari test set’s reference solution', () => {
		const r = solver.solve(robertson, 0, [1, 0, 0], 1e11);
		expect(r.outcome).toBe('done');
		// Mazzia & Magherini, Test Set for IVP Solvers (Univ. of Bari), problem ROBER, reference
		// solution at t = 1e11.
		expect(relativeError(r.y[0], 0.2083340149701255e-7)).toBeLessThan(1e-5);
		expect(relativeError(r.y[1], 0.8333360770334713e-13)).toBeLessThan(1e-5);
		expect(Math.abs(r.y[2] - 0.999999979166505)).toBeLessThan(1e-10);
		// y1 + y2 + y3 = 1 is a linear invariant, which a Rosenbrock method with the exact Jacobian
		// keeps to rounding (Hairer & Wanner II, §IV.7).
		expect(Math.abs(r.y[0] + r.y[1] + r.y[2] - 1)).toBeLessThan(1e-13);
		expect(r.accepted).toBeLessThan(3000);
	});

	it('gets t = 40 right with its finite-difference Jacobian as well', () => {
		const differences = new RosenbrockSolver(3, {
			absoluteTolerance: 1e-12,
			relativeTolerance: 1e-8,
			maxSteps: 100_000
		});
		const r = differences.solve(robertson, 0, [1, 0, 0], reference.robertson.t);
		for (let i = 0; i < 3; i++) {
			expect(relativeError(r.y[i], reference.robertson.y[i])).toBeLessThan(1e-6);
		}
	});
});

describe('RODAS on the stiff Van der Pol oscillator (μ = 1000)', () => {
	const mu = reference.vanDerPol.mu;
	const vanDerPol: Derivative = (_t, y) => [y[1], mu * (1 - y[0] * y[0]) * y[1] - y[0]];

	it.each(reference.vanDerPol.points.map((p) => [p.t, p.y] as const))(
		'agrees at t = %d with an independent computation (SciPy Radau, rtol 1e-10)',
		(tEnd, expected) => {
			const solver = new RosenbrockSolver(2, {
				absoluteTolerance: 1e-8,
				relativeTolerance: 1e-8,
				maxSteps: 100_000
			});
			const r = solver.solve(vanDerPol, 0, [2, 0], tEnd);
			expect(r.outcome).toBe('done');
			// Independent computation with SciPy (stiff-ode.json). t = 3000 lies past two of the
			// relaxation jumps, where errors made earlier are amplified: 100× the tolerance.
			expect(Math.abs(r.y[0] - expected[0])).toBeLessThan(1e-6);
			expect(Math.abs(r.y[1] - expected[1])).toBeLessThan(1e-6);
			// On the slow branches y2' has eigenvalues near −μ(y1² − 1) ≈ −3000: explicit steps
			// would be bounded near 1e-3, i.e. millions of steps to t = 3000.
			expect(r.accepted).toBeLessThan(tEnd < 10 ? 100 : 10_000);
		}
	);
});

describe('RODAS on linear problems with exact solutions', () => {
	// y1' = −y1 + 2 cos t (exact: sin t + cos t − e^−t from y1(0) = 0, by substitution);
	// y2' = y3, y3' = −y2 (exact: cos t, −sin t from (1, 0)). Time-dependent, so ∂f/∂t is used.
	const linear: Derivative = (t, y) => [-y[0] + 2 * Math.cos(t), y[2], -y[1]];
	const exact = (t: number) => [
		Math.sin(t) + Math.cos(t) - Math.exp(-t),
		Math.cos(t),
		-Math.sin(t)
	];
	const largestError = (y: ArrayLike<number>, t: number) =>
		Math.max(...exact(t).map((e, i) => Math.abs(y[i] - e)));

	/** Fixed steps of size h (every step accepted at a tolerance of 1) to t = 2. */
	function runFixedSteps(h: number) {
		const solver = new RosenbrockSolver(3, {
			absoluteTolerance: 1,
			relativeTolerance: 1,
			maxSteps: 10_000,
			initialStepSize: h,
			maxStepSize: h
		});
		let midpointError = 0;
		const r = solver.solve(linear, 0, [0, 1, 0], 2, (tOld, t, _y, dense) => {
			const tMid = 0.5 * (tOld + t);
			const atMid = [0, 1, 2].map((i) => dense(i, tMid));
			midpointError = Math.max(midpointError, largestError(atMid, tMid));
		});
		return { steps: r.accepted, endError: largestError(r.y, 2), midpointError };
	}

	it('converges with order 4, and its continuous output with local error O(h⁴)', () => {
		const coarse = runFixedSteps(0.1);
		const fine = runFixedSteps(0.05);
		expect(coarse.steps).toBe(20);
		expect(fine.steps).toBe(40);
		// Order 4 (Hairer & Wanner II, §IV.7): halving h divides the global error by 2⁴.
		expect(Math.log2(coarse.endError / fine.endError)).toBeGreaterThan(3.7);
		expect(Math.log2(coarse.endError / fine.endError)).toBeLessThan(4.3);
		// The continuous output is of order 3: its error inside a step is O(h⁴) (same source).
		expect(Math.log2(coarse.midpointError / fine.midpointError)).toBeGreaterThan(3.5);
		expect(Math.log2(coarse.midpointError / fine.midpointError)).toBeLessThan(4.3);
	});

	it('holds the requested tolerance with adaptive steps, and its output joins the steps', () => {
		const solver = new RosenbrockSolver(3, {
			absoluteTolerance: 1e-8,
			relativeTolerance: 1e-8,
			maxSteps: 10_000
		});
		let worst = 0;
		let largestJump = 0;
		let previous = [0, 1, 0];
		const r = solver.solve(linear, 0, [0, 1, 0], 10, (tOld, t, y, dense) => {
			for (let k = 1; k <= 4; k++) {
				const tk = tOld + (k / 4) * (t - tOld);
				worst = Math.max(
					worst,
					largestError(
						[0, 1, 2].map((i) => dense(i, tk)),
						tk
					)
				);
			}
			for (let i = 0; i < 3; i++) {
				largestJump = Math.max(largestJump, Math.abs(dense(i, tOld) - previous[i]));
				largestJump = Math.max(largestJump, Math.abs(dense(i, t) - y[i]));
			}
			previous = y.slice();
		});
		expect(r.outcome).toBe('done');
		// Exact solution above; 10× the tolerance for the error carried over 10 time units.
		expect(largestError(r.y, 10)).toBeLessThan(1e-7);
		expect(worst).toBeLessThan(1e-7);
		expect(largestJump).toBeLessThan(1e-14);
	});

	it('integrates a rate quadratic in t exactly (∂f/∂t taken exactly for quadratics)', () => {
		const solver = new RosenbrockSolver(1, {
			absoluteTolerance: 1e-8,
			relativeTolerance: 1e-8,
			maxSteps: 1000
		});
		// y' = 3t², y(0) = 0: y = t³ (exact), and an order-4 method integrates cubics exactly.
		const r = solver.solve((t) => [3 * t * t], 0, [0], 10);
		expect(relativeError(r.y[0], 1000)).toBeLessThan(1e-12);
	});

	it('follows a very stiff driven component (Prothero & Robinson 1974) in few steps', () => {
		// y' = λ(y − sin t) + cos t with y(0) = 0 has y = sin t for every λ (by substitution);
		// λ = −1e6 makes it as stiff as it gets.
		const prothero: Derivative = (t, y) => [-1e6 * (y[0] - Math.sin(t)) + Math.cos(t)];
		const solver = new RosenbrockSolver(1, {
			absoluteTolerance: 1e-6,
			relativeTolerance: 1e-6,
			maxSteps: 10_000
		});
		let worst = 0;
		const r = solver.solve(prothero, 0, [0], 10, (_tOld, t, y) => {
			worst = Math.max(worst, Math.abs(y[0] - Math.sin(t)));
		});
		expect(worst).toBeLessThan(1e-5);
		expect(r.accepted).toBeLessThan(100);
	});
});

describe('RosenbrockSolver outcomes', () => {
	const decay: Derivative = (_t, y) => [-y[0]];
	const options = { absoluteTolerance: 1e-8, relativeTolerance: 1e-8, maxSteps: 1000 };

	it('stops where the observer returns false', () => {
		const solver = new RosenbrockSolver(1, options);
		let stoppedAt = Number.NaN;
		const r = solver.solve(decay, 0, [1], 10, (_tOld, t) => {
			if (t > 1) {
				stoppedAt = t;
				return false;
			}
		});
		expect(r.outcome).toBe('stopped');
		expect(r.t).toBe(stoppedAt);
		// y = e^−t (exact).
		expect(relativeError(r.y[0], Math.exp(-stoppedAt))).toBeLessThan(1e-7);
	});

	it('gives up after its step allowance on a right-hand side that flips at y = 0.5', () => {
		const solver = new RosenbrockSolver(1, { ...options, maxSteps: 5000 });
		const r = solver.solve((_t, y) => [y[0] < 0.5 ? 1 : -1], 0, [0], 2);
		expect(r.outcome).toBe('maxSteps');
		expect(r.accepted + r.rejected).toBe(5000);
		expect(r.t).toBeGreaterThan(0.49);
		expect(r.t).toBeLessThan(0.51);
	});

	it('ends at the start when the interval is empty, and refuses one that runs backwards', () => {
		const solver = new RosenbrockSolver(1, options);
		expect(solver.solve(decay, 3, [2], 3)).toMatchObject({ outcome: 'done', y: [2], accepted: 0 });
		expect(() => solver.solve(decay, 3, [2], 1)).toThrow(RangeError);
	});

	it('counts its evaluations, the finite-difference Jacobians included', () => {
		const solver = new RosenbrockSolver(1, options);
		let calls = 0;
		const r = solver.solve(
			(t, y) => {
				calls++;
				return decay(t, y);
			},
			0,
			[1],
			1
		);
		expect(r.evaluations).toBe(calls);
		expect(r.jacobians).toBe(r.accepted);
	});
});

describe('LU with partial pivoting', () => {
	it('solves a system that needs a row exchange', () => {
		// [[0, 2, 1], [1, 1, 0], [2, 0, 3]] x = [7, 3, 11] has x = (1, 2, 3) (by substitution).
		const a = [0, 2, 1, 1, 1, 0, 2, 0, 3];
		const pivots = [0, 0, 0];
		expect(factorLu(a, 3, pivots)).toBe(true);
		const b = [7, 3, 11];
		solveLu(a, 3, pivots, b);
		expect(b[0]).toBeCloseTo(1, 14);
		expect(b[1]).toBeCloseTo(2, 14);
		expect(b[2]).toBeCloseTo(3, 14);
	});

	it('reports a singular matrix', () => {
		expect(factorLu([1, 2, 2, 4], 2, [0, 0])).toBe(false);
	});
});
