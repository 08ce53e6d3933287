// The shapes shared by the stiff integrator and its callers.

/**
 * Computes y' = f(t, y). The returned array may be the same one on every call (the integrator copies
 * it at once), so a right-hand side can run without allocating.
 */
export type Derivative = (t: number, y: number[]) => ArrayLike<number>;

/**
 * Fills `into` (row-major, n × n) with ∂f/∂y at (t, y); `f` is the value there, which a finite
 * difference needs and an analytic Jacobian may ignore. Returns how many times it called f.
 */
export type JacobianFunction = (
	t: number,
	y: number[],
	f: ArrayLike<number>,
	into: number[]
) => number;

/**
 * The solution component `component` (0-based) at `t` inside the step just accepted; valid only
 * during the observer call that received it (the next step overwrites its coefficients).
 */
export type DenseInterpolant = (component: number, t: number) => number;

/**
 * Called after every accepted step (tOld, t] with the state at t (the integrator's own array: copy it
 * to keep it). Returning `false` ends the integration there (outcome 'stopped').
 */
export type StepObserver = (
	tOld: number,
	t: number,
	y: number[],
	dense: DenseInterpolant
) => boolean | void;

/**
 * - 'done': reached the end time
 * - 'stopped': the observer asked to stop
 * - 'maxSteps': more steps (accepted and rejected) than allowed
 * - 'stepTooSmall': the step fell below the rounding of t (a discontinuity or a failing right-hand side)
 */
export type SolveOutcome = 'done' | 'stopped' | 'maxSteps' | 'stepTooSmall';

export interface SolveResult {
	/** the state where the integration ended */
	y: number[];
	/** where it ended */
	t: number;
	outcome: SolveOutcome;
	accepted: number;
	rejected: number;
	/** right-hand side evaluations, those of the finite-difference Jacobians included */
	evaluations: number;
	/** Jacobians formed: one at each step's start, kept when that step is rejected and retried */
	jacobians: number;
}

export interface RosenbrockOptions {
	absoluteTolerance: number;
	relativeTolerance: number;
	/** accepted plus rejected steps allowed in one `solve` */
	maxSteps: number;
	/** the first step; chosen from the problem when absent */
	initialStepSize?: number;
	/** the largest step; the whole interval when absent */
	maxStepSize?: number;
	/** ∂f/∂y; finite differences when absent */
	jacobian?: JacobianFunction;
	/**
	 * f reads only the first this many states (the rest are integrals of it, such as delivered
	 * volumes): the Jacobian's other columns are zero and finite differences skip them. All when absent.
	 */
	statesRead?: number;
}
