// Stands in for odex's own raw .ts sources (which fail our strict checks); only what chemistry/ uses.
// Runtime entry: node_modules/odex/src/odex.js (CommonJS); svelte.config.js maps `odex` here for tsc.
// No `declare` on the class and enum, on purpose: tsx applies that same mapping at run time and loads
// this file as code; with them left in, the import still links and simulateRun can say what went
// wrong, instead of the whole module graph failing to load.

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
