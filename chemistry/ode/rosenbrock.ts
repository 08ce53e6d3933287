// The RODAS integrator (see rodas-tableau.ts): Jacobian once per step start, LU of I/(hγ) − J for
// each attempted step size, step size control with the predictive controller the authors' code uses
// (Gustafsson 1994, as in rodas.f), continuous output for the observer.
import { chooseInitialStep } from './initial-step';
import { differenceJacobian, differenceTimeDerivative } from './jacobian';
import { factorLu } from './lu';
import { RodasStep } from './rodas-step';
import { ERROR_ESTIMATE_ORDER, RODAS } from './rodas-tableau';
import type {
	Derivative,
	RosenbrockOptions,
	SolveOutcome,
	SolveResult,
	StepObserver
} from './types';

/** rodas.f's defaults: a new step between h/5 and 6h, with safety factor 0.9. */
const MAX_SHRINK = 5;
const MAX_GROWTH = 6;
const SAFETY = 0.9;
/** A step that failed outright (a non-finite stage, a singular matrix) is retried this much smaller. */
const FAILURE_SHRINK = 0.2;
const GAMMA = RODAS.gamma;
const ORDER = ERROR_ESTIMATE_ORDER;

interface Progress {
	t: number;
	h: number;
	accepted: number;
	rejected: number;
	evaluations: number;
	jacobians: number;
	/** the last accepted step and its error, for the predictive controller */
	hAccepted: number;
	errorAccepted: number;
	rejectedLast: boolean;
}

export class RosenbrockSolver {
	private readonly step: RodasStep;
	private readonly y: number[];
	private readonly f0: number[];
	private readonly ft: number[];
	private readonly jacobian: number[];
	private readonly lu: number[];
	private readonly pivots: number[];

	constructor(
		readonly n: number,
		private readonly options: RosenbrockOptions
	) {
		this.step = new RodasStep(n);
		this.y = new Array<number>(n).fill(0);
		this.f0 = new Array<number>(n).fill(0);
		this.ft = new Array<number>(n).fill(0);
		this.jacobian = new Array<number>(n * n).fill(0);
		this.lu = new Array<number>(n * n).fill(0);
		this.pivots = new Array<number>(n).fill(0);
	}

	/** Integrates y' = f(t, y) from (t0, y0) to tEnd ≥ t0, calling `observer` after every step. */
	solve(
		f: Derivative,
		t0: number,
		y0: ArrayLike<number>,
		tEnd: number,
		observer?: StepObserver
	): SolveResult {
		if (!(tEnd >= t0)) throw new RangeError(`The end time ${tEnd} is before the start ${t0}.`);
		const { n, y, options } = this;
		for (let i = 0; i < n; i++) y[i] = y0[i];
		const progress: Progress = {
			t: t0,
			h: 0,
			accepted: 0,
			rejected: 0,
			evaluations: 0,
			jacobians: 0,
			hAccepted: 0,
			errorAccepted: 1,
			rejectedLast: false
		};
		if (tEnd === t0) return this.finish(progress, 'done');
		const hMax = Math.min(options.maxStepSize ?? Infinity, tEnd - t0);
		this.evaluateStart(f, t0, progress);
		progress.h = this.chooseFirstStep(f, t0, hMax, progress);
		return this.integrate(f, tEnd, hMax, progress, observer);
	}

	private integrate(
		f: Derivative,
		tEnd: number,
		hMax: number,
		progress: Progress,
		observer: StepObserver | undefined
	): SolveResult {
		const { n, y, step, options } = this;
		let jacobianCurrent = false;
		for (;;) {
			if (progress.accepted + progress.rejected >= options.maxSteps) {
				return this.finish(progress, 'maxSteps');
			}
			const t = progress.t;
			let h = progress.h;
			if (0.1 * h <= Math.abs(t) * Number.EPSILON || !(h > 0)) {
				return this.finish(progress, 'stepTooSmall');
			}
			const last = t + 1.0001 * h >= tEnd;
			if (last) h = tEnd - t;
			if (!jacobianCurrent) {
				this.formJacobian(f, t, tEnd, progress);
				jacobianCurrent = true;
			}
			if (!this.factor(h)) {
				progress.rejected++;
				progress.h = h * FAILURE_SHRINK;
				continue;
			}
			progress.evaluations += step.attempt(f, t, y, h, this.f0, this.ft, this.lu, this.pivots);
			const error = step.errorNorm(y, options.absoluteTolerance, options.relativeTolerance);
			if (!(error <= 1)) {
				progress.rejected++;
				progress.rejectedLast = true;
				progress.h = Number.isFinite(error) ? h / this.shrinkFactor(error) : h * FAILURE_SHRINK;
				continue;
			}
			const hNext = this.nextStepAfterAccepting(h, error, progress);
			step.keepDenseOutput(t, y, h);
			const tNew = last ? tEnd : t + h;
			for (let i = 0; i < n; i++) y[i] = step.yNew[i];
			progress.t = tNew;
			progress.accepted++;
			if (observer !== undefined && observer(t, tNew, y, step.interpolate) === false) {
				return this.finish(progress, 'stopped');
			}
			if (last) return this.finish(progress, 'done');
			this.evaluateStart(f, tNew, progress);
			jacobianCurrent = false;
			progress.h = Math.min(hNext, hMax);
		}
	}

	private chooseFirstStep(f: Derivative, t0: number, hMax: number, progress: Progress): number {
		const given = this.options.initialStepSize;
		if (given !== undefined) return Math.min(given, hMax);
		progress.evaluations++;
		const { absoluteTolerance, relativeTolerance } = this.options;
		const tolerances = { absoluteTolerance, relativeTolerance, errorOrder: ORDER };
		// ft is free until the first Jacobian: the estimate's Euler step goes there.
		return chooseInitialStep(f, t0, this.y, this.f0, tolerances, hMax, this.ft);
	}

	/** h/h_new from the error alone, within the allowed change. */
	private shrinkFactor(error: number): number {
		const factor = Math.pow(error, 1 / ORDER) / SAFETY;
		return Math.max(1 / MAX_GROWTH, Math.min(MAX_SHRINK, factor));
	}

	/**
	 * The step after an accepted one: the smaller of the standard and Gustafsson's predictive choice,
	 * never larger than h right after a rejection (rodas.f).
	 */
	private nextStepAfterAccepting(h: number, error: number, progress: Progress): number {
		let factor = this.shrinkFactor(error);
		if (progress.accepted > 0) {
			const ratio = (error * error) / progress.errorAccepted;
			let predicted = ((progress.hAccepted / h) * Math.pow(ratio, 1 / ORDER)) / SAFETY;
			predicted = Math.max(1 / MAX_GROWTH, Math.min(MAX_SHRINK, predicted));
			if (predicted > factor) factor = predicted;
		}
		progress.hAccepted = h;
		progress.errorAccepted = Math.max(1e-2, error);
		let hNext = h / factor;
		if (progress.rejectedLast) hNext = Math.min(hNext, h);
		progress.rejectedLast = false;
		return hNext;
	}

	/** f at the step's start, copied (f may hand back the same array every call). */
	private evaluateStart(f: Derivative, t: number, progress: Progress): void {
		const values = f(t, this.y);
		for (let i = 0; i < this.n; i++) this.f0[i] = values[i];
		progress.evaluations++;
	}

	private formJacobian(f: Derivative, t: number, tEnd: number, progress: Progress): void {
		const { n, y, f0, jacobian, options } = this;
		progress.evaluations += options.jacobian
			? options.jacobian(t, y, f0, jacobian)
			: differenceJacobian(f, t, y, f0, jacobian, n, options.statesRead ?? n);
		differenceTimeDerivative(f, t, y, f0, this.ft, n, tEnd - t);
		progress.evaluations += 2;
		progress.jacobians++;
	}

	/** Factors I/(hγ) − J; false when singular. */
	private factor(h: number): boolean {
		const { n, jacobian, lu } = this;
		const diagonal = 1 / (h * GAMMA);
		for (let k = 0; k < n * n; k++) lu[k] = -jacobian[k];
		for (let i = 0; i < n; i++) lu[i * n + i] += diagonal;
		return factorLu(lu, n, this.pivots);
	}

	private finish(progress: Progress, outcome: SolveOutcome): SolveResult {
		const { accepted, rejected, evaluations, jacobians, t } = progress;
		return { y: this.y.slice(), t, outcome, accepted, rejected, evaluations, jacobians };
	}
}
