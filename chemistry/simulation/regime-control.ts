// The run's regime (substrate exhausted, O2-limited, quasi-steady DO): entering and leaving each,
// the intervals spent in them, and the switches that end an integration stretch in the current one.
import { formatNumber, MAX_REPORTS_PER_KIND } from './events';
import type { RegimeSwitch } from './crossings';
import {
	C,
	computeOxygenRelaxationPerH,
	computeOxygenSurplusAtZeroMgPerLH,
	computeQuasiSteadyOxygenMgPerL,
	computeSubstrateSurplusAtZeroGPerLH,
	fillEffectiveState,
	NORMAL_REGIME,
	O2_MOLAR_MASS_G_PER_MOL,
	S,
	STATE_COUNT,
	type FlowPhase,
	type ModelParameters,
	type Regime
} from './model';
import type { SimulationEvent } from './types';

/** Regime changes settled at one instant before integration goes on (each one enables the next). */
const MAX_REGIME_CHANGES_AT_ONCE = 4;

export interface TimeInterval {
	fromH: number;
	toH: number;
}

/**
 * Holds the regime for the run's state vector `y` (shared with the integrator, which it edits when a
 * regime holds S or DO at a value) and writes O2-depletion reports into `events`.
 */
export class RegimeControl {
	readonly regime: Regime = { ...NORMAL_REGIME };
	readonly quasiSteadyIntervals: TimeInterval[] = [];
	readonly oxygenLimitedIntervals: TimeInterval[] = [];
	private oxygenLimitedReports = 0;
	/** the effective state with S at 0, for the exhaustion guards */
	private readonly atZeroSubstrate = new Array<number>(STATE_COUNT).fill(0);
	private readonly effective = new Array<number>(STATE_COUNT).fill(0);

	constructor(
		private readonly p: ModelParameters,
		private readonly y: number[],
		private readonly events: SimulationEvent[],
		/** DO relaxation rate above which its balance is solved at quasi-steady state */
		private readonly quasiSteadyAbovePerH: number
	) {}

	/** The state the model sees under the regime (into a reused array: copy it to keep it). */
	effectiveState(y: ArrayLike<number>): number[] {
		return fillEffectiveState(this.p, this.regime, y, this.effective);
	}

	/** Closes the intervals still open at the run's end. */
	closeIntervals(endH: number): void {
		for (const intervals of [this.quasiSteadyIntervals, this.oxygenLimitedIntervals]) {
			const last = intervals.at(-1);
			if (last !== undefined && Number.isNaN(last.toH)) last.toH = endH;
		}
	}

	/**
	 * Picks the dynamic or the quasi-steady O2 balance for the state at tH, with hysteresis (see
	 * OXYGEN_QUASI_STEADY_RATIO); entering the dynamic balance starts DO from its quasi-steady value.
	 * While DO is held at 0 (O2-limited) neither applies.
	 */
	chooseOxygenBalance(tH: number): void {
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
	settle(tH: number, phase: FlowPhase): void {
		for (let i = 0; i < MAX_REGIME_CHANGES_AT_ONCE; i++) {
			const state = this.effectiveState(this.y);
			if (!this.settleSubstrate(tH, phase, state) && !this.settleOxygen(tH, state)) break;
		}
		this.chooseOxygenBalance(tH);
	}

	/** Enters or leaves substrate exhaustion if the state at tH calls for it; true if it did. */
	private settleSubstrate(tH: number, phase: FlowPhase, state: ArrayLike<number>): boolean {
		if (!this.regime.substrateExhausted) {
			if (this.y[S] <= 0 && this.substrateSurplusAtZero(phase, tH, state) < 0) {
				this.setSubstrateExhausted(true);
				return true;
			}
		} else if (this.y[S] > 0 || this.substrateSurplusAtZero(phase, tH, state) > 0) {
			this.setSubstrateExhausted(false);
			return true;
		}
		return false;
	}

	/** Enters or leaves O2 limitation if the state at tH calls for it; true if it did. */
	private settleOxygen(tH: number, state: ArrayLike<number>): boolean {
		const p = this.p;
		if (p.oxygen === null) return false;
		if (!this.regime.oxygenLimited) {
			if (state[C] <= 0 && computeOxygenSurplusAtZeroMgPerLH(p, state) < 0) {
				this.setOxygenLimited(true, tH);
				return true;
			}
		} else if (this.y[C] > 0 || computeOxygenSurplusAtZeroMgPerLH(p, state) > 0) {
			this.setOxygenLimited(false, tH);
			return true;
		}
		return false;
	}

	/** The switches that can end a stretch in the current regime. */
	switches(phase: FlowPhase): RegimeSwitch[] {
		const switches: RegimeSwitch[] = [this.substrateSwitch(phase)];
		if (this.p.oxygen === null) return switches;
		switches.push(this.oxygenLimitSwitch());
		if (!this.regime.oxygenLimited) switches.push(this.oxygenBalanceSwitch());
		return switches;
	}

	private substrateSwitch(phase: FlowPhase): RegimeSwitch {
		if (this.regime.substrateExhausted) {
			return {
				value: (tH, state) => this.substrateSurplusAtZero(phase, tH, state),
				apply: () => this.setSubstrateExhausted(false)
			};
		}
		// S below 0 while the supply at S = 0 falls short of maintenance; a dip within the
		// integrator's tolerance while the supply covers it is rounding, not exhaustion.
		// (The supply is asked for only once S is below 0: at every step it would cost the feed laws again.)
		return {
			value: (tH, state) =>
				state[S] >= 0
					? -state[S]
					: Math.min(-state[S], -this.substrateSurplusAtZero(phase, tH, state)),
			apply: () => this.setSubstrateExhausted(true)
		};
	}

	private oxygenLimitSwitch(): RegimeSwitch {
		const p = this.p;
		if (this.regime.oxygenLimited) {
			return {
				value: (_tH, state) => computeOxygenSurplusAtZeroMgPerLH(p, state),
				apply: (tH) => this.setOxygenLimited(false, tH)
			};
		}
		return {
			value: (_tH, state) => Math.min(-state[C], -computeOxygenSurplusAtZeroMgPerLH(p, state)),
			apply: (tH) => this.setOxygenLimited(true, tH)
		};
	}

	/** Between the dynamic and the quasi-steady O2 balance (not while O2-limited). */
	private oxygenBalanceSwitch(): RegimeSwitch {
		const p = this.p;
		const quasiSteady = this.regime.quasiSteadyOxygen;
		const switchAt = quasiSteady ? 0.5 * this.quasiSteadyAbovePerH : this.quasiSteadyAbovePerH;
		const switchSign = quasiSteady ? -1 : 1;
		return {
			value: (_tH, state) => switchSign * (computeOxygenRelaxationPerH(p, state) - switchAt),
			apply: (tH) => this.setQuasiSteady(!quasiSteady, tH)
		};
	}
}
