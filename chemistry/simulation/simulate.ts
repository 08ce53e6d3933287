import {
	RosenbrockSolver,
	type DenseInterpolant,
	type SolveResult,
	type StepObserver
} from '../ode';
import { buildSimulationResult } from './build-result';
import { findRegimeSwitch, findStop, type Cut } from './crossings';
import { SimulationFailedError } from './errors';
import {
	hasCrossed,
	locateCrossing,
	MAX_REPORTS_PER_KIND,
	updateArming,
	type ThresholdEvent
} from './events';
import { FeedStreams } from './feed-streams';
import {
	ABSOLUTE_TOLERANCE,
	createDerivative,
	OXYGEN_QUASI_STEADY_RATIO,
	RELATIVE_TOLERANCE,
	STATE_COUNT,
	type FlowPhase
} from './model';
import { planSegments, type Segment } from './modes';
import { interpolate, OutputRecorder } from './output-recorder';
import { RegimeControl } from './regime-control';
import { enterSegment } from './segment-entry';
import { checkFinite, checkNonNegative } from './state-checks';
import { createTrackers } from './trackers';
import type { SimulationEvent, SimulationRequest, SimulationResult } from './types';
import { validateSimulationRequest, type SimulationPlan } from './validate';

export { NEGATIVE_STATE_TOLERANCE } from './state-checks';

/** Steps allowed per integration stretch; beyond this the run changes too abruptly to follow. */
export const MAX_STEPS_PER_SEGMENT = 200_000;
/**
 * Regime changes allowed in one segment. A culture enters and leaves exhaustion or O2 limitation a
 * few times per feed or draw; thousands means the run chatters at a boundary it cannot settle on.
 */
export const MAX_REGIME_CHANGES_PER_SEGMENT = 2000;

/**
 * Simulates one culture run. Throws `ChemistryInputError` (with the request field) for input the
 * model cannot use and `SimulationFailedError` when the integration cannot be trusted.
 */
export function simulateRun(request: SimulationRequest): SimulationResult {
	const plan = validateSimulationRequest(request);
	return new RunIntegrator(plan).run();
}

class RunIntegrator {
	private readonly plan: SimulationPlan;
	private readonly y: number[];
	private readonly events: SimulationEvent[] = [];
	private readonly trackers: ThresholdEvent[];
	private readonly washout: ThresholdEvent | null;
	private readonly solver: RosenbrockSolver;
	private readonly feedStreams: FeedStreams | null;
	/** STATE_COUNT plus the feed streams' delivered-volume slots */
	private readonly stateCount: number;
	private readonly stats = { accepted: 0, rejected: 0, evaluations: 0 };
	private readonly regimes: RegimeControl;
	private readonly recorder: OutputRecorder;
	/** reused for effective states at a step's dense output */
	private readonly scratch = new Array<number>(STATE_COUNT).fill(0);
	private stoppedAtH: number | null = null;

	constructor(plan: SimulationPlan) {
		this.plan = plan;
		const p = plan.parameters;
		this.feedStreams = plan.feeds === null ? null : new FeedStreams(plan.feeds, p);
		const slotCount = this.feedStreams?.slotCount ?? 0;
		this.stateCount = STATE_COUNT + slotCount;
		this.y = [...plan.initialState, ...new Array<number>(slotCount).fill(0)];
		this.solver = createSolver(this.stateCount);
		const quasiSteadyAbovePerH =
			OXYGEN_QUASI_STEADY_RATIO * Math.max(p.muMaxPerH, plan.continuous?.dilutionPerH ?? 0);
		this.regimes = new RegimeControl(p, this.y, this.events, quasiSteadyAbovePerH);
		const streamCount = this.feedStreams?.count ?? 0;
		this.recorder = new OutputRecorder(p, this.regimes, plan.outputTimesH, streamCount);
		const { trackers, washout } = createTrackers(plan);
		this.trackers = trackers;
		this.washout = washout;
	}

	run(): SimulationResult {
		this.regimes.chooseOxygenBalance(0);
		// A quantity already past a falling threshold at the start is reported at t = 0.
		const start = this.regimes.effectiveState(this.y);
		for (const event of this.trackers) {
			if (event.armed && !event.stops && hasCrossed(event, event.measure(start)))
				this.report(event, 0);
		}
		const segments = planSegments(this.plan);
		for (let i = 0; i < segments.length && this.stoppedAtH === null; i++) {
			this.integrateSegment(segments[i], i === segments.length - 1);
		}
		this.regimes.closeIntervals(this.stoppedAtH ?? this.plan.endH);
		const { plan, y, events, regimes, feedStreams, stats, stoppedAtH } = this;
		const out = this.recorder.out;
		return buildSimulationResult({ plan, y, out, events, regimes, feedStreams, stats, stoppedAtH });
	}

	private integrateSegment(segment: Segment, isLast: boolean): void {
		const { plan, y, events, feedStreams, washout } = this;
		const phase = enterSegment(segment, { plan, y, events, feedStreams, washout });
		let fromH = segment.startH;
		this.regimes.settle(fromH, phase);
		for (let changes = 0; ; changes++) {
			if (changes > MAX_REGIME_CHANGES_PER_SEGMENT) {
				throw new SimulationFailedError(
					`The run switched between limited and unlimited growth more than ${MAX_REGIME_CHANGES_PER_SEGMENT} times before t = ${fromH.toFixed(3)} h: it keeps hitting a limit it cannot settle on (typically a feed law that switches abruptly at exhaustion). Try a smoother feed law.`,
					'regimeChatter',
					fromH
				);
			}
			const cut = this.integrateStretch(segment, phase, fromH, isLast);
			if (cut === null || cut.kind === 'stop') return;
			fromH = cut.tH;
			cut.apply(fromH);
			this.regimes.settle(fromH, phase);
		}
	}

	/**
	 * Integrates from `fromH` to the segment's end, or to a stop or a change of O2 balance, which it
	 * returns. Leaves the state at where it ended.
	 */
	private integrateStretch(
		segment: Segment,
		phase: FlowPhase,
		fromH: number,
		isLast: boolean
	): Cut | null {
		const { y, regimes, recorder, trackers } = this;
		const startState = regimes.effectiveState(y);
		for (const event of trackers) updateArming(event, event.measure(startState));
		const alreadyPast = this.stopIfAlreadyPast(fromH, phase);
		if (alreadyPast !== null) return { kind: 'stop', tH: fromH, event: alreadyPast };

		const derivative = createDerivative(
			this.plan.parameters,
			phase,
			{ ...regimes.regime },
			this.stateCount
		);
		const endH = segment.endH;
		const eps = 1e-9 * Math.max(1, Math.abs(endH));
		const previous = trackers.map((event) => event.measure(startState));
		const current = previous.slice();
		const switches = regimes.switches(phase);
		const previousSwitch = switches.map((change) => change.value(fromH, startState));
		let reachedH = fromH;
		// One closure per stretch rather than per step (the observer runs at every step).
		let currentDense: DenseInterpolant | null = null;
		const at = (tH: number) => regimes.effectiveState(interpolate(currentDense!, tH, this.scratch));
		// (Assigned in the observer, which TypeScript's narrowing does not follow; hence the cast.)
		let cut = null as Cut | null;

		const observer: StepObserver = (xOld, x, yNew, dense) => {
			reachedH = x;
			checkFinite(yNew, x);
			const state = regimes.effectiveState(yNew);
			for (let i = 0; i < trackers.length; i++) current[i] = trackers[i].measure(state);
			currentDense = dense;

			// Stops and a change of O2 balance first: nothing after them happens in this stretch.
			cut = findStop(trackers, previous, current, at, xOld, x);
			const change = findRegimeSwitch(switches, previousSwitch, state, at, xOld, x);
			if (change !== null && (cut === null || change.tH < cut.tH)) cut = change;
			this.reportCrossings(previous, current, at, xOld, x, cut === null ? Infinity : cut.tH);
			if (cut === null) {
				checkNonNegative(yNew, x);
				for (let i = 0; i < trackers.length; i++) updateArming(trackers[i], current[i]);
			}

			recorder.recordStep(cut, dense, phase, xOld, x, isLast ? Infinity : endH, eps);
			if (cut !== null) {
				this.endStretchAt(cut, dense, phase, eps);
				return false;
			}
			for (let i = 0; i < trackers.length; i++) previous[i] = current[i];
		};

		recorder.recordDueBy(fromH, eps, y, phase);
		const result = this.solver.solve(derivative, fromH, y, endH, observer);
		this.countSteps(result, reachedH);
		if (cut === null) for (let i = 0; i < this.stateCount; i++) y[i] = result.y[i];
		return cut;
	}

	/** Moves the state to the cut and, at a stop, writes its last point and ends the run there. */
	private endStretchAt(cut: Cut, dense: DenseInterpolant, phase: FlowPhase, eps: number): void {
		interpolate(dense, cut.tH, this.y, this.stateCount);
		if (cut.kind !== 'stop') return;
		this.recorder.appendFinalPoint(cut.tH, eps, this.y, phase);
		this.report(cut.event, cut.tH);
		this.stoppedAtH = cut.tH;
	}

	/** Adds a stretch's integrator counts; a stretch that ran out of steps, or of step size, fails the run. */
	private countSteps(result: SolveResult, reachedH: number): void {
		this.stats.accepted += result.accepted;
		this.stats.rejected += result.rejected;
		this.stats.evaluations += result.evaluations;
		if (result.outcome === 'maxSteps') {
			throw new SimulationFailedError(
				`The integrator needed more than ${MAX_STEPS_PER_SEGMENT} steps and stopped at t = ${reachedH.toFixed(3)} h: the run changes too abruptly for it to follow (typically a feed expression that switches on and off). Try a smooth feed law or a shorter run.`,
				'stepLimit',
				reachedH
			);
		}
		if (result.outcome === 'stepTooSmall') {
			throw new SimulationFailedError(
				`The integrator's step shrank to nothing at t = ${result.t.toFixed(3)} h: the right-hand side jumps there (typically a feed expression that switches on and off, or one that cannot be evaluated). Try a smooth feed law.`,
				'stepLimit',
				result.t
			);
		}
	}

	/** Reports the non-stopping events that crossed in (xOld, x], before any cut at `cutH`. */
	private reportCrossings(
		previous: number[],
		current: number[],
		at: (tH: number) => ArrayLike<number>,
		xOld: number,
		x: number,
		cutH: number
	): void {
		const trackers = this.trackers;
		for (let i = 0; i < trackers.length; i++) {
			const event = trackers[i];
			if (event.stops || !event.armed) continue;
			if (!hasCrossed(event, current[i]) || hasCrossed(event, previous[i])) continue;
			const g = (tH: number) => event.measure(at(tH)) - event.threshold;
			const tH = locateCrossing(
				g,
				xOld,
				previous[i] - event.threshold,
				x,
				current[i] - event.threshold
			);
			if (tH < cutH) this.report(event, tH);
		}
	}

	/** A stopping threshold already met at a stretch's start (e.g. a bolus up to the maximum volume). */
	private stopIfAlreadyPast(tH: number, phase: FlowPhase): ThresholdEvent | null {
		const state = this.regimes.effectiveState(this.y);
		for (const event of this.trackers) {
			if (event.stops && event.armed && hasCrossed(event, event.measure(state))) {
				const eps = 1e-9 * Math.max(1, tH);
				this.recorder.recordDueBy(tH, eps, this.y, phase);
				this.recorder.appendFinalPoint(tH, eps, this.y, phase);
				this.report(event, tH);
				this.stoppedAtH = tH;
				return event;
			}
		}
		return null;
	}

	private report(event: ThresholdEvent, tH: number): void {
		event.armed = false;
		event.count++;
		if (event.count <= MAX_REPORTS_PER_KIND) {
			this.events.push({ kind: event.kind, tH, message: event.describe() });
		}
	}
}

function createSolver(stateCount: number): RosenbrockSolver {
	// A stiff integrator: fast DO and substrate dynamics at high biomass, and the DO-stat feed's steep
	// response, bound an explicit method's step by stability rather than accuracy.
	return new RosenbrockSolver(stateCount, {
		absoluteTolerance: ABSOLUTE_TOLERANCE,
		relativeTolerance: RELATIVE_TOLERANCE,
		maxSteps: MAX_STEPS_PER_SEGMENT,
		// The delivered-volume slots after the culture's states are integrals the model never reads.
		statesRead: STATE_COUNT
	});
}
