/**
 * The culture model. Its full description, shown as the simulation page's help, is
 * `SIMULATION_MODEL_HELP` at the end of this file; in brief:
 *
 * States: biomass X (g/L), substrate S (g/L), product P (g/L), volume V (L), dissolved O2 C (mg/L).
 *
 *   μ     = μmax·S/(Ks + S) · C/(K_O + C)                  Monod 1949; the O2 factor (multiplicative
 *                                                          double-Monod form, textbook, from memory)
 *                                                          only when K_O > 0 and an O2 balance is solved;
 *                                                          at DO = 0 without K_O, μ = what transfer carries
 *   dX/dt = μX − k_X·X                                     k_X = F_in/V (fed-batch, chemostat);
 *                                                          perfusion: k_X = b + (D − b)(1 − R)
 *   dS/dt = −(μ/Yx/s + m_s)·X + Σᵢ (Fᵢ/V)(S_f,i − S)      Pirt 1965 maintenance, in full while S > 0;
 *                                                          S held at 0 while the supply cannot meet m_s·X
 *   dP/dt = (αμ + β)·X − (F_in/V)·P                        Luedeking & Piret 1959
 *   dV/dt = F_in − F_out,  F_in = Σᵢ Fᵢ                    fed-batch: up to 8 streams, each with its
 *                                                          own law; otherwise the one medium flow
 *   dC/dt = kLa(C* − C) − OUR,  OUR = 1000·μX/Yx/O2 + m_O·X   (mg O2/L/h; film theory, Lewis & Whitman 1924)
 *           or, where DO relaxes far faster than the culture changes, kLa(C* − C) = OUR (quasi-steady)
 *   dDᵢ/dt = Fᵢ                                            with several streams, each one's delivered
 *                                                          volume, as extra states after C
 *
 * The limited forms (S or DO held at 0) are regimes the integrator enters and leaves at located
 * crossings (`Regime`). Tolerances, events and the feeding laws are described in the help text below;
 * this file holds the right-hand side, written to allocate nothing per call (the integrator calls it
 * ~10⁵ times).
 */
import type { Derivative } from '../ode';
import { O2_MOLAR_MASS_G_PER_MOL } from '../oxygen';
export { SIMULATION_MODEL_HELP } from './model-help';

export { O2_MOLAR_MASS_G_PER_MOL };

/** Integrator tolerances on every state (absolute in the state's own unit, relative dimensionless). */
export const ABSOLUTE_TOLERANCE = 1e-8;
export const RELATIVE_TOLERANCE = 1e-8;

/**
 * The substrateExhausted event's threshold, min(1 % of Ks, 1 mg/L): growth there is at most ~1 % of
 * μmax. Only the event uses it; maintenance draws in full down to S = 0 (see `Regime`).
 */
export function computeExhaustionThresholdGPerL(ksGPerL: number): number {
	return Math.min(0.01 * ksGPerL, 1e-3);
}

/** Growth counts as O2-limited once DO is below 5 % of saturation: transfer then runs at ≥ 95 % of kLa·C*. */
export const OXYGEN_LIMITED_FRACTION_OF_SATURATION = 0.05;

/**
 * DO is solved at quasi-steady state (dC/dt = 0) while it relaxes more than this many times faster
 * than the culture can change (λ = kLa + ∂OUR/∂C > 1000·max(μmax, D)): its lag behind that value is
 * then of order 0.1 %, while integrating it explicitly would take ~λ steps per hour (O2-limited DO at
 * high density settles in milliseconds). Back to the dynamic balance below half that rate.
 */
export const OXYGEN_QUASI_STEADY_RATIO = 1000;

/**
 * A typed feed law that brings in more than this many culture volumes per hour is a unit slip, not a
 * plan (a plausibility guard; real fed-batch feeds run far below one volume per hour).
 */
export const MAX_INFLOW_VOLUMES_PER_H = 1000;

/** Washout: biomass below 1 % of its value when continuous operation (or the first draw cycle) began. */
export const WASHOUT_FRACTION = 0.01;

/** State vector layout. */
export const X = 0;
export const S = 1;
export const P = 2;
export const V = 3;
export const C = 4;
export const STATE_COUNT = 5;

export interface ModelParameters {
	muMaxPerH: number;
	ksGPerL: number;
	yieldXS: number;
	maintenanceGPerGH: number;
	alpha: number;
	beta: number;
	/** the O2 transfer balance; null when none is solved */
	oxygen: OxygenParameters | null;
	/**
	 * Yx/O2 (g/g) when no transfer balance is solved but the O2 demand of the simulated growth is
	 * wanted (OUR = 1000·μX/Yx/O2, transfer unlimited); null otherwise
	 */
	demandYieldXO2: number | null;
}

export interface OxygenParameters {
	kLaPerH: number;
	saturationMgPerL: number;
	yieldXO2: number;
	/** 0: growth does not slow as DO falls until DO reaches 0 (then transfer limits it) */
	koMgPerL: number;
	maintenanceMgPerGH: number;
	/**
	 * false: DO is followed (feed laws read it; it is held at 0 where transfer falls short) but never
	 * slows growth, so OUR is the demand of the plan rather than what the vessel supplies
	 */
	limitsGrowth: boolean;
}

/**
 * Which form the balances take over a stretch of the run. The integrator switches between forms at
 * located crossings, so each stretch has a smooth right-hand side.
 * - quasiSteadyOxygen: DO solved at quasi-steady state instead of integrated (see
 *   OXYGEN_QUASI_STEADY_RATIO).
 * - substrateExhausted: S has reached 0 and the supply cannot meet maintenance: S is held at 0, μ = 0,
 *   and the substrate that arrives is all spent on maintenance. Maintenance (Pirt) draws in full at
 *   any S > 0, so it cannot fade before exhaustion.
 * - oxygenLimited: DO has reached 0 and transfer cannot meet the demand: DO is held at 0 and growth
 *   runs at what transfer supplies, μ = Yx/O2·(kLa·C* − m_O·X)/(1000·X) (OTR = OUR at DO = 0).
 */
export interface Regime {
	quasiSteadyOxygen: boolean;
	substrateExhausted: boolean;
	oxygenLimited: boolean;
}

export const NORMAL_REGIME: Readonly<Regime> = {
	quasiSteadyOxygen: false,
	substrateExhausted: false,
	oxygenLimited: false
};

/**
 * Feed rate (L/h) from time, state and the current substrate uptake (g/L/h); the stat laws need
 * the uptake, and passing it avoids computing μ twice per call.
 */
export type FeedLaw = (tH: number, y: ArrayLike<number>, uptakeGPerLH: number) => number;

/** One running fed-batch feed stream. */
export interface FeedStreamFlow {
	feedLaw: FeedLaw;
	substrateGPerL: number;
	/** the stream's index in the request, where its outputs go */
	stream: number;
	/**
	 * state slot that integrates the stream's delivered volume; null with a single stream, whose
	 * delivered volume is the volume gained (dV/dt is its rate)
	 */
	deliveredSlot: number | null;
}

/** What flows during one integration segment. */
export type FlowPhase =
	| { kind: 'closed' }
	| { kind: 'fed'; streams: readonly FeedStreamFlow[] }
	| {
			kind: 'continuous';
			dilutionPerH: number;
			/** rate at which cells leave: D for a chemostat, b + (D − b)(1 − R) with perfusion */
			cellRemovalPerH: number;
			feedSubstrateGPerL: number;
	  };

/** μ from substrate alone, Monod: μmax·S/(Ks + S). */
function computeSubstrateGrowthRatePerH(p: ModelParameters, y: ArrayLike<number>): number {
	const s = y[S] > 0 ? y[S] : 0;
	return (p.muMaxPerH * s) / (p.ksGPerL + s);
}

/** Growth rate transfer alone can carry at DO = 0: (kLa·C* − m_O·X)·Yx/O2/(1000·X), never below 0. */
export function computeTransferLimitedGrowthRatePerH(
	o2: OxygenParameters,
	y: ArrayLike<number>
): number {
	const x = y[X];
	const spare = o2.kLaPerH * o2.saturationMgPerL - o2.maintenanceMgPerGH * x;
	if (spare <= 0) return 0;
	return x > 0 ? (spare * o2.yieldXO2) / (1000 * x) : Infinity;
}

export function computeGrowthRatePerH(
	p: ModelParameters,
	y: ArrayLike<number>,
	regime: Readonly<Regime> = NORMAL_REGIME
): number {
	if (regime.substrateExhausted) return 0;
	const mu = computeSubstrateGrowthRatePerH(p, y);
	const o2 = p.oxygen;
	if (o2 === null || !o2.limitsGrowth) return mu;
	if (o2.koMgPerL > 0) {
		if (regime.oxygenLimited) return 0;
		const c = y[C] > 0 ? y[C] : 0;
		return (mu * c) / (o2.koMgPerL + c);
	}
	if (regime.oxygenLimited) {
		const limit = computeTransferLimitedGrowthRatePerH(o2, y);
		return limit < mu ? limit : mu;
	}
	return mu;
}

/** Substrate uptake per biomass, g/g/h: Pirt, μ/Yx/s + m_s, maintenance in full at any S. */
export function computeSpecificUptakePerH(p: ModelParameters, mu: number): number {
	return mu / p.yieldXS + p.maintenanceGPerGH;
}

/** Oxygen uptake rate, mg O2/L/h: with a transfer balance, or the demand alone; 0 with neither. */
export function computeOurMgPerLH(p: ModelParameters, y: ArrayLike<number>, mu: number): number {
	const x = y[X];
	if (p.oxygen === null) return p.demandYieldXO2 === null ? 0 : (1000 * mu * x) / p.demandYieldXO2;
	return (1000 * mu * x) / p.oxygen.yieldXO2 + p.oxygen.maintenanceMgPerGH * x;
}

/** O2 demand of growth at full oxygen (before the O2 factor), mg/L/h. */
function computeGrowthOxygenDemandMgPerLH(
	o2: OxygenParameters,
	p: ModelParameters,
	y: ArrayLike<number>
): number {
	return (1000 * computeSubstrateGrowthRatePerH(p, y) * y[X]) / o2.yieldXO2;
}

/**
 * How far the O2 demand at DO = 0 falls short of transfer, kLa·C* − OUR(C = 0), mg/L/h: negative
 * when DO cannot stay above 0. Without K_O growth at DO → 0 still asks for its full demand; with
 * K_O > 0 growth has stopped there and only maintenance asks.
 */
export function computeOxygenSurplusAtZeroMgPerLH(
	p: ModelParameters,
	y: ArrayLike<number>
): number {
	const o2 = p.oxygen;
	if (o2 === null) return Infinity;
	const growth = o2.koMgPerL > 0 ? 0 : computeGrowthOxygenDemandMgPerLH(o2, p, y);
	return o2.kLaPerH * o2.saturationMgPerL - growth - o2.maintenanceMgPerGH * y[X];
}

/**
 * DO at which transfer meets uptake, kLa(C* − C) = OUR(C): with K_O > 0 the positive root of
 * kLa·C² + b·C − K_O(kLa·C* − M) = 0, b = A + M − kLa(C* − K_O) (A the growth demand at full O2,
 * M maintenance). Negative when demand exceeds kLa·C* even at C = 0, i.e. oxygen is depleted.
 */
export function computeQuasiSteadyOxygenMgPerL(p: ModelParameters, y: ArrayLike<number>): number {
	const o2 = p.oxygen;
	if (o2 === null) return 0;
	const a = computeGrowthOxygenDemandMgPerLH(o2, p, y);
	const m = o2.maintenanceMgPerGH * y[X];
	const { kLaPerH: kLa, saturationMgPerL: cStar, koMgPerL: ko } = o2;
	if (ko === 0) return cStar - (a + m) / kLa;
	const b = a + m - kLa * (cStar - ko);
	const c0 = ko * (kLa * cStar - m);
	const root = Math.sqrt(Math.max(0, b * b + 4 * kLa * c0));
	// The two algebraically equal forms, each free of cancellation on its side of b = 0.
	return b > 0 ? (2 * c0) / (b + root) : (root - b) / (2 * kLa);
}

/** How fast DO relaxes to its quasi-steady value, λ = kLa + ∂OUR/∂C, 1/h. */
export function computeOxygenRelaxationPerH(p: ModelParameters, y: ArrayLike<number>): number {
	const o2 = p.oxygen;
	if (o2 === null) return 0;
	if (o2.koMgPerL === 0) return o2.kLaPerH;
	const c = y[C] > 0 ? y[C] : 0;
	const ko = o2.koMgPerL;
	return o2.kLaPerH + (computeGrowthOxygenDemandMgPerLH(o2, p, y) * ko) / ((ko + c) * (ko + c));
}

/**
 * Copies the state as the balances read it in this regime: S held at 0 when exhausted, DO held at 0
 * when O2-limited, or DO at its quasi-steady value when it is solved that way.
 */
export function fillEffectiveState(
	p: ModelParameters,
	regime: Readonly<Regime>,
	y: ArrayLike<number>,
	out: number[]
): number[] {
	for (let i = 0; i < STATE_COUNT; i++) out[i] = y[i];
	if (regime.substrateExhausted) out[S] = 0;
	if (regime.oxygenLimited) out[C] = 0;
	else if (regime.quasiSteadyOxygen) out[C] = computeQuasiSteadyOxygenMgPerL(p, out);
	return out;
}

/**
 * Inflow at (t, y) during a phase, L/h; `y` is an effective state. When fed, each stream's rate is
 * also written to `streamRatesLPerH` at the stream's index (entries of streams not running are left
 * as they are).
 */
export function computeInflowLPerH(
	p: ModelParameters,
	phase: FlowPhase,
	tH: number,
	y: ArrayLike<number>,
	mu: number,
	streamRatesLPerH: number[] | null = null
): number {
	if (phase.kind === 'closed') return 0;
	if (phase.kind === 'continuous') return phase.dilutionPerH * y[V];
	const uptake = computeSpecificUptakePerH(p, mu) * y[X];
	const streams = phase.streams;
	let total = 0;
	for (let i = 0; i < streams.length; i++) {
		const f = streams[i].feedLaw(tH, y, uptake);
		total += f;
		if (streamRatesLPerH !== null) streamRatesLPerH[streams[i].stream] = f;
	}
	return total;
}

/**
 * Substrate arriving per litre of culture, g/L/h, minus what maintenance asks, m_s·X, at the effective
 * state `y` taken at S = 0 with μ = 0: positive when the supply alone would lift S from 0.
 */
export function computeSubstrateSurplusAtZeroGPerLH(
	p: ModelParameters,
	phase: FlowPhase,
	tH: number,
	y: ArrayLike<number>
): number {
	const maintenance = p.maintenanceGPerGH * y[X];
	if (phase.kind === 'closed') return -maintenance;
	if (phase.kind === 'continuous')
		return phase.dilutionPerH * phase.feedSubstrateGPerL - maintenance;
	let supply = 0;
	for (const stream of phase.streams) {
		supply += stream.feedLaw(tH, y, maintenance) * stream.substrateGPerL;
	}
	return supply / y[V] - maintenance;
}

/**
 * The right-hand side in one regime. With `quasiSteadyOxygen`, DO is held at its quasi-steady value
 * (dC/dt = 0 in the state; the value itself is recomputed from X and S at every call); S and DO are
 * held at 0 in their limited regimes. `stateCount` is STATE_COUNT plus the slots that integrate the
 * feed streams' delivered volumes.
 */
export function createDerivative(
	p: ModelParameters,
	phase: FlowPhase,
	regime: Readonly<Regime>,
	stateCount = STATE_COUNT
): Derivative {
	const dy = new Array<number>(stateCount).fill(0);
	const effective = new Array<number>(STATE_COUNT).fill(0);
	const { yieldXS, maintenanceGPerGH, alpha, beta } = p;
	const o2 = p.oxygen;
	const kLa = o2?.kLaPerH ?? 0;
	const cStar = o2?.saturationMgPerL ?? 0;
	const oxygenPerBiomass = o2 ? 1000 / o2.yieldXO2 : 0;
	const oxygenMaintenance = o2?.maintenanceMgPerGH ?? 0;
	const dynamicOxygen = o2 !== null && !regime.quasiSteadyOxygen && !regime.oxygenLimited;
	const holdSubstrate = regime.substrateExhausted;
	const adjustsState =
		regime.quasiSteadyOxygen || regime.substrateExhausted || regime.oxygenLimited;
	const continuous = phase.kind === 'continuous';
	const dilution = continuous ? phase.dilutionPerH : 0;
	const cellRemoval = continuous ? phase.cellRemovalPerH : 0;
	const feedSubstrate = continuous ? phase.feedSubstrateGPerL : 0;
	// Flat arrays rather than the stream objects: the loop below runs at every call.
	const streams = phase.kind === 'fed' ? phase.streams : [];
	const streamCount = streams.length;
	const laws = streams.map((stream) => stream.feedLaw);
	const streamSubstrates = streams.map((stream) => stream.substrateGPerL);
	const deliveredSlots = streams.map((stream) => stream.deliveredSlot ?? -1);

	return (tH, state) => {
		const y = adjustsState ? fillEffectiveState(p, regime, state, effective) : state;
		const x = y[X];
		const mu = computeGrowthRatePerH(p, y, regime);
		const uptake = (mu / yieldXS + maintenanceGPerGH) * x;
		let d = dilution;
		let kx = cellRemoval;
		let dV = 0;
		let substrateSupply: number;
		if (streamCount > 0) {
			// Σ F_i/V and Σ (F_i/V)(S_f,i − S), stream by stream: with one stream this is the same
			// arithmetic, to the last bit, as a single feed term.
			const v = y[V];
			d = 0;
			substrateSupply = 0;
			for (let i = 0; i < streamCount; i++) {
				const f = laws[i](tH, y, uptake);
				const di = f / v;
				d += di;
				substrateSupply += di * (streamSubstrates[i] - y[S]);
				dV += f;
				if (deliveredSlots[i] >= 0) dy[deliveredSlots[i]] = f;
			}
			kx = d;
		} else {
			substrateSupply = d * (feedSubstrate - y[S]);
		}
		dy[X] = mu * x - kx * x;
		// Exhausted: what arrives is spent on maintenance at once, so S stays at 0.
		dy[S] = holdSubstrate ? 0 : -uptake + substrateSupply;
		dy[P] = (alpha * mu + beta) * x - d * y[P];
		dy[V] = dV;
		dy[C] = dynamicOxygen
			? kLa * (cStar - y[C]) - (oxygenPerBiomass * mu + oxygenMaintenance) * x
			: 0;
		return dy;
	};
}
