// A stiff ODE integrator with continuous output: RODAS (Hairer & Wanner), see rodas-tableau.ts.
export { RosenbrockSolver } from './rosenbrock';
export type {
	Derivative,
	DenseInterpolant,
	JacobianFunction,
	RosenbrockOptions,
	SolveOutcome,
	SolveResult,
	StepObserver
} from './types';
