// The types of odex 2.0.4 for `#odex` (package.json "imports": TypeScript reads this file, Node, Vite and
// tsx load node_modules/odex/src/odex.js). odex's package points TypeScript at its raw .ts sources, which
// fail our strict checks; odex 3 (a release candidate) passes them but changes the API. Only what
// chemistry/ uses is declared.

/** Computes y' = f(x, y); the solver copies the returned array, so it may be reused between calls. */
export type Derivative = (x: number, y: number[]) => number[];

/** Dense-output interpolant for component `c` (0-based) at `x` within the step just accepted. */
export type DenseInterpolant = (c: number, x: number) => number;

/**
 * Called after every accepted step (and once at the start, `nr === 1`, without an interpolant).
 * Returning `false` stops the integration with `Outcome.EarlyReturn`.
 */
export type OutputFunction = (
	nr: number,
	xOld: number,
	x: number,
	y: number[],
	dense?: DenseInterpolant
) => boolean | void;

export enum Outcome {
	Converged = 0,
	MaxStepsExceeded = 1,
	EarlyReturn = 2
}

export interface SolveResult {
	y: number[];
	outcome: Outcome;
	nStep: number;
	xEnd: number;
	nAccept: number;
	nReject: number;
	nEval: number;
}

export class Solver {
	constructor(n: number);
	n: number;
	maxSteps: number;
	initialStepSize: number;
	maxStepSize: number;
	/** KM, must be > 2; default 9 */
	maxExtrapolationColumns: number;
	denseOutput: boolean;
	denseComponents: number[] | undefined;
	relativeTolerance: number | number[];
	absoluteTolerance: number | number[];
	solve(f: Derivative, x: number, y0: number[], xEnd: number, solOut?: OutputFunction): SolveResult;
}
