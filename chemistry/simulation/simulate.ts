import { Outcome, Solver, type DenseInterpolant, type OutputFunction } from '#odex';
import { SimulationFailedError } from './errors';
import {
	formatNumber,
	hasCrossed,
	locateCrossing,
	MAX_REPORTS_PER_KIND,
	updateArming,
	type ThresholdEvent
} from './events';
import { FeedStreams } from './feed-streams';
import { createTrackers } from './trackers';
import { findRegimeSwitch, findStop, type Cut, type RegimeSwitch } from './crossings';
import { appendOutputPoint, createOutput, truncateOutput, type Output } from './output';
import { applyDrawFill } from './feeding';
import {
	ABSOLUTE_TOLERANCE,
	C,
	computeOxygenRelaxationPerH,
	computeOxygenSurplusAtZeroMgPerLH,
	computeQuasiSteadyOxygenMgPerL,
	computeSubstrateSurplusAtZeroGPerLH,
	createDerivative,
	fillEffectiveState,
	NORMAL_REGIME,
	O2_MOLAR_MASS_G_PER_MOL,
	OXYGEN_QUASI_STEADY_RATIO,
	P,
	RELATIVE_TOLERANCE,
	S,
	STATE_COUNT,
	V,
	WASHOUT_FRACTION,
	X,
	type FlowPhase,
	type ModelParameters,
	type Regime
} from './model';
import { planSegments, type Segment } from './modes';
import type { SimulationEvent, SimulationRequest, SimulationResult } from './types';
import { validateSimulationRequest, type SimulationPlan } from './validate';

/** Steps allowed per integration stretch; beyond this the run is too stiff for the integrator. */
export const MAX_STEPS_PER_SEGMENT = 200_000;
/** ODEX extrapolation columns (its default is 9); see the constructor. */
export const EXTRAPOLATION_COLUMNS = 4;
/** A concentration or volume below −this (in its own unit) is a failed integration, not rounding. */
export const NEGATIVE_STATE_TOLERANCE = 1e-6;
/** Regime changes settled at one instant before integration goes on (each one enables the next). */
const MAX_REGIME_CHANGES_AT_ONCE = 4;
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
	assertIntegratorLoaded();
	const plan = validateSimulationRequest(request);
	return new RunIntegrator(plan).run();
}

function assertIntegratorLoaded(): void {
	// Under tsx, the project's tsconfig path mapping sends `odex` to its type declaration; say so
	// plainly rather than failing later with "solve is not a function".
	if (typeof Solver !== 'function' || typeof Solver.prototype?.solve !== 'function') {
		throw new SimulationFailedError(
			'The odex integrator did not load (the module "odex" resolved to its type declaration, not node_modules/odex/src/odex.js).',
			'integratorMissing',
			0
		);
	}
}

class RunIntegrator {
	private readonly plan: SimulationPlan;
	private readonly p: ModelParameters;
	private readonly y: number[];
	private readonly out: Output;
	private readonly events: SimulationEvent[] = [];
	private readonly trackers: ThresholdEvent[];
	private readonly washout: ThresholdEvent | null;
	private readonly solver: Solver;
	private readonly feedStreams: FeedStreams | null;
	/** STATE_COUNT plus the feed streams' delivered-volume slots */
	private readonly stateCount: number;
	/** reused for each output point's stream rates */
	private readonly streamRates: number[];
	private readonly stats = { accepted: 0, rejected: 0, evaluations: 0 };
	/** DO relaxation rate above which its balance is solved at quasi-steady state */
	private readonly quasiSteadyAbovePerH: number;
	private readonly regime: Regime = { ...NORMAL_REGIME };
	private readonly quasiSteadyIntervals: { fromH: number; toH: number }[] = [];
	private readonly oxygenLimitedIntervals: { fromH: number; toH: number }[] = [];
	private oxygenLimitedReports = 0;
	/** the effective state with S at 0, for the exhaustion guards */
	private readonly atZeroSubstrate = new Array<number>(STATE_COUNT).fill(0);
	/** reused for effective states and dense output points */
	private readonly scratch = new Array<number>(STATE_COUNT).fill(0);
	private readonly effective = new Array<number>(STATE_COUNT).fill(0);
	private nextOutput = 0;
	private stoppedAtH: number | null = null;

	constructor(plan: SimulationPlan) {
		this.plan = plan;
		this.p = plan.parameters;
		this.feedStreams = plan.feeds === null ? null : new FeedStreams(plan.feeds, this.p);
		const slotCount = this.feedStreams?.slotCount ?? 0;
		this.stateCount = STATE_COUNT + slotCount;
		this.y = [...plan.initialState, ...new Array<number>(slotCount).fill(0)];
		const streamCount = this.feedStreams?.count ?? 0;
		this.streamRates = new Array<number>(streamCount).fill(0);
		this.out = createOutput(plan.outputTimesH.length, streamCount);
		this.solver = new Solver(this.stateCount);
		this.solver.denseOutput = true;
		this.solver.absoluteTolerance = ABSOLUTE_TOLERANCE;
		this.solver.relativeTolerance = RELATIVE_TOLERANCE;
		this.solver.maxSteps = MAX_STEPS_PER_SEGMENT;
		// These runs turn stiff (fast DO and substrate dynamics at high biomass), where stability rather
		// than accuracy bounds the step; a low extrapolation order then needs about half the right-hand
		// side evaluations of the default 9 columns, with results equal within the tolerances.
		this.solver.maxExtrapolationColumns = EXTRAPOLATION_COLUMNS;
		this.quasiSteadyAbovePerH =
			OXYGEN_QUASI_STEADY_RATIO * Math.max(this.p.muMaxPerH, plan.continuous?.dilutionPerH ?? 0);

		const { trackers, washout } = createTrackers(plan);
		this.trackers = trackers;
		this.washout = washout;
	}

	run(): SimulationResult {
		this.chooseOxygenBalance(0);
		// A quantity already past a falling threshold at the start is reported at t = 0.
		const start = this.effectiveState(this.y);
		for (const event of this.trackers) {
			if (event.armed && !event.stops && hasCrossed(event, event.measure(start)))
				this.report(event, 0);
		}
		const segments = planSegments(this.plan);
		for (let i = 0; i < segments.length && this.stoppedAtH === null; i++) {
			this.integrateSegment(segments[i], i === segments.length - 1);
		}
		const endH = this.stoppedAtH ?? this.plan.endH;
		for (const intervals of [this.quasiSteadyIntervals, this.oxygenLimitedIntervals]) {
			const last = intervals.at(-1);
			if (last !== undefined && Number.isNaN(last.toH)) last.toH = endH;
		}
		return this.buildResult();
	}

	private effectiveState(y: ArrayLike<number>): number[] {
		return fillEffectiveState(this.p, this.regime, y, this.effective);
	}

	/**
	 * Picks the dynamic or the quasi-steady O2 balance for the state at tH, with hysteresis (see
	 * OXYGEN_QUASI_STEADY_RATIO); entering the dynamic balance starts DO from its quasi-steady value.
	 * While DO is held at 0 (O2-limited) neither applies.
	 */
	private chooseOxygenBalance(tH: number): void {
		if (this.p.oxygen === null || this.regime.oxygenLimited) return;
		const lambda = computeOxygenRelaxationPerH(this.p, this.effectiveState(this.y));
		if (!this.regime.quasiSteadyOxygen && lambda > this.quasiSteadyAbovePerH)
			this.setQuasiSteady(true, tH);
		else if (this.regime.quasiSteadyOxygen && lambda < 0.5 * this.quasiSteadyAbovePerH)
			this.setQuasiSteady(false, tH);
	}

	private setQuasiSteady(on: boolean, tH: number): void {
		if (on) {
			this.quasiSteadyIntervals.push({ fromH: tH, toH: Number.NaN });
		} else {
			this.y[C] = computeQuasiSteadyOxygenMgPerL(this.p, this.effectiveState(this.y));
			this.quasiSteadyIntervals[this.quasiSteadyIntervals.length - 1].toH = tH;
		}
		this.regime.quasiSteadyOxygen = on;
	}

	/** Substrate surplus over maintenance at S = 0 (see computeSubstrateSurplusAtZeroGPerLH). */
	private substrateSurplusAtZero(phase: FlowPhase, tH: number, state: ArrayLike<number>): number {
		const atZero = this.atZeroSubstrate;
		for (let i = 0; i < STATE_COUNT; i++) atZero[i] = state[i];
		atZero[S] = 0;
		return computeSubstrateSurplusAtZeroGPerLH(this.p, phase, tH, atZero);
	}

	private setSubstrateExhausted(on: boolean): void {
		if (on) this.y[S] = 0;
		this.regime.substrateExhausted = on;
	}

	/** Entering holds DO at 0 (dC/dt = 0 there after); leaving starts it from the state's DO. */
	private setOxygenLimited(on: boolean, tH: number): void {
		if (on) {
			if (this.regime.quasiSteadyOxygen) this.setQuasiSteady(false, tH);
			this.y[C] = 0;
			this.oxygenLimitedIntervals.push({ fromH: tH, toH: Number.NaN });
			this.oxygenLimitedReports++;
			if (this.oxygenLimitedReports <= MAX_REPORTS_PER_KIND) {
				this.events.push({ kind: 'oxygenDepleted', tH, message: this.describeOxygenDepletion() });
			}
		} else {
			this.oxygenLimitedIntervals[this.oxygenLimitedIntervals.length - 1].toH = tH;
		}
		this.regime.oxygenLimited = on;
	}

	private describeOxygenDepletion(): string {
		const o2 = this.p.oxygen!;
		const maxOtr = formatNumber((o2.kLaPerH * o2.saturationMgPerL) / O2_MOLAR_MASS_G_PER_MOL);
		if (!o2.limitsGrowth) {
			return `DO reached 0: the demand exceeds the maximum transfer kLa·C* (${maxOtr} mmol/L/h). Growth is not held back by O2 in this run, so OUR shows the demand the vessel would have to meet.`;
		}
		return o2.koMgPerL > 0
			? `DO reached 0: maintenance alone asks for more O2 than the maximum transfer kLa·C* (${maxOtr} mmol/L/h); growth stops until demand falls.`
			: `DO reached 0: demand exceeds the maximum transfer kLa·C* (${maxOtr} mmol/L/h), so growth runs only as fast as transfer supplies O2 (OTR = OUR at DO = 0).`;
	}

	/**
	 * Brings the regime in line with the state at tH (at the start, after a segment's jump, after a
	 * switch): S or DO at 0 with a supply short of demand holds it there; a jump above 0, or a supply
	 * that now covers the demand, releases it. Then picks the O2 balance.
	 */
	private settleRegime(tH: number, phase: FlowPhase): void {
		const p = this.p;
		const regime = this.regime;
		for (let i = 0; i < MAX_REGIME_CHANGES_AT_ONCE; i++) {
			const state = this.effectiveState(this.y);
			if (!regime.substrateExhausted) {
				if (this.y[S] <= 0 && this.substrateSurplusAtZero(phase, tH, state) < 0) {
					this.setSubstrateExhausted(true);
					continue;
				}
			} else if (this.y[S] > 0 || this.substrateSurplusAtZero(phase, tH, state) > 0) {
				this.setSubstrateExhausted(false);
				continue;
			}
			if (p.oxygen !== null) {
				if (!regime.oxygenLimited) {
					if (state[C] <= 0 && computeOxygenSurplusAtZeroMgPerLH(p, state) < 0) {
						this.setOxygenLimited(true, tH);
						continue;
					}
				} else if (this.y[C] > 0 || computeOxygenSurplusAtZeroMgPerLH(p, state) > 0) {
					this.setOxygenLimited(false, tH);
					continue;
				}
			}
			break;
		}
		this.chooseOxygenBalance(tH);
	}

	/** The switches that can end a stretch in the current regime. */
	private regimeSwitches(phase: FlowPhase): RegimeSwitch[] {
		const p = this.p;
		const regime = this.regime;
		const switches: RegimeSwitch[] = [];
		if (regime.substrateExhausted) {
			switches.push({
				value: (tH, state) => this.substrateSurplusAtZero(phase, tH, state),
				apply: () => this.setSubstrateExhausted(false)
			});
		} else {
			// S below 0 while the supply at S = 0 falls short of maintenance; a dip within the
			// integrator's tolerance while the supply covers it is rounding, not exhaustion.
			// (The supply is asked for only once S is below 0: at every step it would cost the feed laws again.)
			switches.push({
				value: (tH, state) =>
					state[S] >= 0
						? -state[S]
						: Math.min(-state[S], -this.substrateSurplusAtZero(phase, tH, state)),
				apply: () => this.setSubstrateExhausted(true)
			});
		}
		if (p.oxygen === null) return switches;
		if (regime.oxygenLimited) {
			switches.push({
				value: (_tH, state) => computeOxygenSurplusAtZeroMgPerLH(p, state),
				apply: (tH) => this.setOxygenLimited(false, tH)
			});
			return switches;
		}
		switches.push({
			value: (_tH, state) => Math.min(-state[C], -computeOxygenSurplusAtZeroMgPerLH(p, state)),
			apply: (tH) => this.setOxygenLimited(true, tH)
		});
		const quasiSteady = regime.quasiSteadyOxygen;
		const switchAt = quasiSteady ? 0.5 * this.quasiSteadyAbovePerH : this.quasiSteadyAbovePerH;
		const switchSign = quasiSteady ? -1 : 1;
		switches.push({
			value: (_tH, state) => switchSign * (computeOxygenRelaxationPerH(p, state) - switchAt),
			apply: (tH) => this.setQuasiSteady(!quasiSteady, tH)
		});
		return switches;
	}

	private integrateSegment(segment: Segment, isLast: boolean): void {
		const phase = this.enterSegment(segment);
		let fromH = segment.startH;
		this.settleRegime(fromH, phase);
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
			this.settleRegime(fromH, phase);
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
		const y = this.y;
		const p = this.p;
		const startState = this.effectiveState(y);
		for (const event of this.trackers) updateArming(event, event.measure(startState));
		const alreadyPast = this.stopIfAlreadyPast(fromH, phase);
		if (alreadyPast !== null) return { kind: 'stop', tH: fromH, event: alreadyPast };

		const derivative = createDerivative(p, phase, { ...this.regime }, this.stateCount);
		const endH = segment.endH;
		const eps = 1e-9 * Math.max(1, Math.abs(endH));
		const times = this.plan.outputTimesH;
		const trackers = this.trackers;
		const previous = trackers.map((event) => event.measure(startState));
		const current = previous.slice();
		const switches = this.regimeSwitches(phase);
		const previousSwitch = switches.map((change) => change.value(fromH, startState));
		let reachedH = fromH;
		// One closure per stretch rather than per step (the observer runs at every step).
		let currentDense: DenseInterpolant | null = null;
		const at = (tH: number) =>
			this.effectiveState(this.interpolate(currentDense!, tH, this.scratch));
		// (Assigned in the observer, which TypeScript's narrowing does not follow; hence the cast.)
		let cut = null as Cut | null;

		const observer: OutputFunction = (nr, xOld, x, yNew, dense) => {
			if (nr === 1 || dense === undefined) {
				while (this.nextOutput < times.length && times[this.nextOutput] <= x + eps) {
					this.record(times[this.nextOutput], this.effectiveState(yNew), phase);
				}
				return;
			}
			reachedH = x;
			this.checkFinite(yNew, x);
			const state = this.effectiveState(yNew);
			for (let i = 0; i < trackers.length; i++) current[i] = trackers[i].measure(state);
			currentDense = dense;

			// Stops and a change of O2 balance first: nothing after them happens in this stretch.
			cut = findStop(trackers, previous, current, at, xOld, x);
			const change = findRegimeSwitch(switches, previousSwitch, state, at, xOld, x);
			if (change !== null && (cut === null || change.tH < cut.tH)) cut = change;
			const cutH = cut === null ? Infinity : cut.tH;
			this.reportCrossings(previous, current, at, xOld, x, cutH);
			if (cut === null) {
				this.checkNonNegative(yNew, x);
				for (let i = 0; i < trackers.length; i++) updateArming(trackers[i], current[i]);
			}

			this.recordStep(cut, dense, phase, xOld, x, isLast ? Infinity : endH, eps);
			if (cut !== null) {
				this.interpolate(dense, cutH, y, this.stateCount);
				if (cut.kind === 'stop') {
					if (this.out.count === 0 || cutH - this.out.t[this.out.count - 1] > eps) {
						this.appendPoint(cutH, this.effectiveState(y), phase);
					}
					this.report(cut.event, cutH);
					this.stoppedAtH = cutH;
				}
				return false;
			}
			for (let i = 0; i < trackers.length; i++) previous[i] = current[i];
		};

		const result = this.solver.solve(derivative, fromH, y.slice(), endH, observer);
		this.stats.accepted += result.nAccept;
		this.stats.rejected += result.nReject;
		this.stats.evaluations += result.nEval;
		if (result.outcome === Outcome.MaxStepsExceeded) {
			throw new SimulationFailedError(
				`The integrator needed more than ${MAX_STEPS_PER_SEGMENT} steps and stopped at t = ${reachedH.toFixed(3)} h: the run is too stiff for it (typically very fast substrate dynamics at high biomass, or a feed expression that switches abruptly). Try a larger Ks, a smooth feed law, or a shorter run.`,
				'stepLimit',
				reachedH
			);
		}
		if (cut === null) for (let i = 0; i < this.stateCount; i++) y[i] = result.y[i];
		return cut;
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

	/**
	 * Writes the output points of the step (xOld, x] up to any cut; `segmentEndH` is Infinity in the
	 * last segment, otherwise an output time on it belongs to the next segment (the state after the jump).
	 */
	private recordStep(
		cut: Cut | null,
		dense: DenseInterpolant,
		phase: FlowPhase,
		xOld: number,
		x: number,
		segmentEndH: number,
		eps: number
	): void {
		const times = this.plan.outputTimesH;
		while (this.nextOutput < times.length) {
			const t = times[this.nextOutput];
			if (cut?.kind === 'stop') {
				if (t > cut.tH + eps) break;
				this.recordDense(t < cut.tH ? t : cut.tH, dense, phase);
			} else if (cut?.kind === 'switch') {
				// Output times at the switch belong to the stretch after it.
				if (t >= cut.tH - eps) break;
				this.recordDense(t < xOld ? xOld : t, dense, phase);
			} else {
				if (t > x + eps || t >= segmentEndH - eps) break;
				this.recordDense(t < xOld ? xOld : t > x ? x : t, dense, phase);
			}
		}
	}

	/** Applies what happens at a segment's start and returns its flows. */
	private enterSegment(segment: Segment): FlowPhase {
		const plan = this.plan;
		const y = this.y;
		const saturation = this.p.oxygen?.saturationMgPerL ?? null;
		switch (segment.entry) {
			case 'feedStart':
				this.events.push(
					...this.feedStreams!.start(segment.startingFeeds, segment.startH, y, plan.maxVolumeL)
				);
				break;
			case 'continuousStart':
				this.armWashout();
				if (segment.startH > 0) {
					this.events.push({
						kind: 'feedStarted',
						tH: segment.startH,
						message: `Continuous operation started at D = ${formatNumber(plan.continuous!.dilutionPerH)} /h.`
					});
				}
				break;
			case 'cycleStart':
				this.armWashout();
				break;
			case 'draw': {
				const { fraction } = plan.drawFill!;
				applyDrawFill(y, fraction, plan.feedSubstrateGPerL, saturation);
				this.events.push({
					kind: 'draw',
					tH: segment.startH,
					message: `Drew ${formatNumber(100 * fraction)} % (${formatNumber(fraction * y[V])} L) and refilled with fresh medium.`
				});
				break;
			}
		}
		if (segment.flow === 'closed') return { kind: 'closed' };
		if (segment.flow === 'continuous') {
			return {
				kind: 'continuous',
				...plan.continuous!,
				feedSubstrateGPerL: plan.feedSubstrateGPerL
			};
		}
		return this.feedStreams!.phase();
	}

	private armWashout(): void {
		const washout = this.washout;
		if (washout === null) return;
		const reference = this.y[X];
		washout.threshold = WASHOUT_FRACTION * reference;
		washout.armed = true;
		const began =
			this.plan.mode === 'drawFill' ? 'the draw cycles began' : 'continuous operation began';
		washout.describe = () =>
			`Washout: biomass fell below 1 % of the ${formatNumber(reference)} g/L it had when ${began}.`;
	}

	/** A stopping threshold already met at a stretch's start (e.g. a bolus up to the maximum volume). */
	private stopIfAlreadyPast(tH: number, phase: FlowPhase): ThresholdEvent | null {
		const state = this.effectiveState(this.y);
		for (const event of this.trackers) {
			if (event.stops && event.armed && hasCrossed(event, event.measure(state))) {
				const times = this.plan.outputTimesH;
				const eps = 1e-9 * Math.max(1, tH);
				while (this.nextOutput < times.length && times[this.nextOutput] <= tH + eps) {
					this.record(times[this.nextOutput], this.effectiveState(this.y), phase);
				}
				if (this.out.count === 0 || tH - this.out.t[this.out.count - 1] > eps) {
					this.appendPoint(tH, this.effectiveState(this.y), phase);
				}
				this.report(event, tH);
				this.stoppedAtH = tH;
				return event;
			}
		}
		return null;
	}

	private checkFinite(y: number[], tH: number): void {
		for (let i = 0; i < STATE_COUNT; i++) {
			if (!Number.isFinite(y[i])) {
				throw new SimulationFailedError(
					`The integration produced a non-finite ${STATE_NAMES[i]} at t = ${tH.toFixed(3)} h.`,
					'nonFinite',
					tH
				);
			}
		}
	}

	/** Checked only on a step that ends the stretch nowhere earlier: a step past a regime change (S below 0 at exhaustion) is cut back to it. */
	private checkNonNegative(y: number[], tH: number): void {
		for (const i of [X, S, P, V]) {
			if (y[i] < -NEGATIVE_STATE_TOLERANCE) {
				throw new SimulationFailedError(
					`The integration drove ${STATE_NAMES[i]} to ${y[i].toExponential(2)} at t = ${tH.toFixed(3)} h, below zero beyond the tolerance.`,
					'negativeState',
					tH
				);
			}
		}
	}

	private report(event: ThresholdEvent, tH: number): void {
		event.armed = false;
		event.count++;
		if (event.count <= MAX_REPORTS_PER_KIND) {
			this.events.push({ kind: event.kind, tH, message: event.describe() });
		}
	}

	/** The first `count` states at tH (output points need the culture's, not the delivered volumes). */
	private interpolate(
		dense: DenseInterpolant,
		tH: number,
		into: number[],
		count = STATE_COUNT
	): number[] {
		for (let i = 0; i < count; i++) into[i] = dense(i, tH);
		return into;
	}

	private recordDense(tH: number, dense: DenseInterpolant, phase: FlowPhase): void {
		const state = this.effectiveState(this.interpolate(dense, tH, this.scratch));
		this.record(this.plan.outputTimesH[this.nextOutput], state, phase, tH);
	}

	/** Writes the next output point; `evaluatedAtH` is where the state was taken (clamped into the step). */
	private record(tH: number, state: ArrayLike<number>, phase: FlowPhase, evaluatedAtH = tH): void {
		this.nextOutput++;
		this.appendPoint(tH, state, phase, evaluatedAtH);
	}

	/** Appends an output point from an effective state. */
	private appendPoint(
		tH: number,
		state: ArrayLike<number>,
		phase: FlowPhase,
		evaluatedAtH = tH
	): void {
		const { out, p, regime, streamRates } = this;
		appendOutputPoint(out, p, regime, streamRates, tH, state, phase, evaluatedAtH);
	}

	private buildResult(): SimulationResult {
		const o = this.out;
		const n = truncateOutput(o);
		const o2 = this.p.oxygen;
		const maxOtr = o2 === null ? 0 : (o2.kLaPerH * o2.saturationMgPerL) / O2_MOLAR_MASS_G_PER_MOL;
		const result: SimulationResult = {
			t: o.t,
			biomassGPerL: o.x,
			substrateGPerL: o.s,
			productGPerL: o.p,
			volumeL: o.v,
			dissolvedOxygenMgPerL: o2 === null ? null : o.c,
			feedLPerH: o.feed,
			feedStreams:
				this.feedStreams?.results(
					this.y,
					this.plan.initialState[V],
					o.streamFeeds.length > 0 ? o.streamFeeds : [o.feed.slice()]
				) ?? null,
			ourMmolPerLH: o2 === null && this.p.demandYieldXO2 === null ? null : o.our,
			maxOtrMmolPerLH: o2 === null ? null : new Array<number>(n).fill(maxOtr),
			events: this.events.slice().sort((a, b) => a.tH - b.tH),
			tolerances: { absolute: ABSOLUTE_TOLERANCE, relative: RELATIVE_TOLERANCE },
			quasiSteadyOxygenH: o2 === null ? null : this.quasiSteadyIntervals,
			oxygenLimitedH: o2 === null ? null : this.oxygenLimitedIntervals,
			integratorSteps: { ...this.stats }
		};
		if (this.stoppedAtH !== null) result.stoppedAtH = this.stoppedAtH;
		return result;
	}
}

const STATE_NAMES = ['biomass', 'substrate', 'product', 'volume', 'dissolved oxygen'];
