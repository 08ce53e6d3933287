/**
 * The culture model. Its full description, shown as the simulation page's help, is
 * `SIMULATION_MODEL_HELP` at the end of this file; in brief:
 *
 * States: biomass X (g/L), substrate S (g/L), product P (g/L), volume V (L), dissolved O2 C (mg/L).
 *
 *   μ     = μmax·S/(Ks + S) · C/(K_O + C)                  Monod 1949; the O2 factor (multiplicative
 *                                                          double-Monod form, textbook, from memory)
 *                                                          only when K_O > 0 and an O2 balance is solved
 *   dX/dt = μX − k_X·X                                     k_X = F_in/V (fed-batch, chemostat);
 *                                                          perfusion: k_X = b + (D − b)(1 − R)
 *   dS/dt = −(μ/Yx/s + m_s·S/(S + S_ex))·X + Σᵢ (Fᵢ/V)(S_f,i − S)   Pirt 1965 maintenance
 *   dP/dt = (αμ + β)·X − (F_in/V)·P                        Luedeking & Piret 1959
 *   dV/dt = F_in − F_out,  F_in = Σᵢ Fᵢ                    fed-batch: up to 8 streams, each with its
 *                                                          own law; otherwise the one medium flow
 *   dC/dt = kLa(C* − C) − OUR,  OUR = 1000·μX/Yx/O2 + m_O·X   (mg O2/L/h; film theory, Lewis & Whitman 1924)
 *           or, where DO relaxes far faster than the culture changes, kLa(C* − C) = OUR (quasi-steady)
 *   dDᵢ/dt = Fᵢ                                            with several streams, each one's delivered
 *                                                          volume, as extra states after C
 *
 * Tolerances, events and the feeding laws are described in the help text below; this file holds
 * the right-hand side, written to allocate nothing per call (the integrator calls it ~10⁵ times).
 */
import type { Derivative } from 'odex';

/** O2, 2 × 15.999 g/mol (IUPAC 2021 standard atomic weight of O). */
export const O2_MOLAR_MASS_G_PER_MOL = 31.998;

/** Integrator tolerances on every state (absolute in the state's own unit, relative dimensionless). */
export const ABSOLUTE_TOLERANCE = 1e-8;
export const RELATIVE_TOLERANCE = 1e-8;

/** Substrate counts as exhausted below min(1 % of Ks, 1 mg/L): growth is then at most ~1 % of μmax. */
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
	/** S_ex: maintenance draws on substrate only while some is left (see help) */
	exhaustionGPerL: number;
	alpha: number;
	beta: number;
	oxygen: OxygenParameters | null;
}

export interface OxygenParameters {
	kLaPerH: number;
	saturationMgPerL: number;
	yieldXO2: number;
	/** 0: growth does not slow as DO falls */
	koMgPerL: number;
	maintenanceMgPerGH: number;
}

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

export function computeGrowthRatePerH(p: ModelParameters, y: ArrayLike<number>): number {
	const s = y[S] > 0 ? y[S] : 0;
	let mu = (p.muMaxPerH * s) / (p.ksGPerL + s);
	if (p.oxygen !== null && p.oxygen.koMgPerL > 0) {
		const c = y[C] > 0 ? y[C] : 0;
		mu *= c / (p.oxygen.koMgPerL + c);
	}
	return mu;
}

/** Substrate uptake per biomass, g/g/h. */
export function computeSpecificUptakePerH(
	p: ModelParameters,
	y: ArrayLike<number>,
	mu: number
): number {
	const s = y[S] > 0 ? y[S] : 0;
	return mu / p.yieldXS + (p.maintenanceGPerGH * s) / (s + p.exhaustionGPerL);
}

/** Oxygen uptake rate, mg O2/L/h (0 without an O2 balance). */
export function computeOurMgPerLH(p: ModelParameters, y: ArrayLike<number>, mu: number): number {
	if (p.oxygen === null) return 0;
	const x = y[X];
	return (1000 * mu * x) / p.oxygen.yieldXO2 + p.oxygen.maintenanceMgPerGH * x;
}

/** O2 demand of growth at full oxygen (before the O2 factor), mg/L/h. */
function computeGrowthOxygenDemandMgPerLH(
	o2: OxygenParameters,
	p: ModelParameters,
	y: ArrayLike<number>
): number {
	const s = y[S] > 0 ? y[S] : 0;
	return (1000 * ((p.muMaxPerH * s) / (p.ksGPerL + s)) * y[X]) / o2.yieldXO2;
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
 * Copies the state, with DO replaced by its quasi-steady value when the O2 balance is solved that
 * way: every rate below reads DO from the state it is given.
 */
export function fillEffectiveState(
	p: ModelParameters,
	quasiSteadyOxygen: boolean,
	y: ArrayLike<number>,
	out: number[]
): number[] {
	for (let i = 0; i < STATE_COUNT; i++) out[i] = y[i];
	if (quasiSteadyOxygen) out[C] = computeQuasiSteadyOxygenMgPerL(p, y);
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
	mu = computeGrowthRatePerH(p, y),
	streamRatesLPerH: number[] | null = null
): number {
	if (phase.kind === 'closed') return 0;
	if (phase.kind === 'continuous') return phase.dilutionPerH * y[V];
	const uptake = computeSpecificUptakePerH(p, y, mu) * y[X];
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
 * The right-hand side. With `quasiSteadyOxygen`, DO is held at its quasi-steady value (dC/dt = 0 in
 * the state; the value itself is recomputed from X and S at every call). `stateCount` is
 * STATE_COUNT plus the slots that integrate the feed streams' delivered volumes.
 */
export function createDerivative(
	p: ModelParameters,
	phase: FlowPhase,
	quasiSteadyOxygen: boolean,
	stateCount = STATE_COUNT
): Derivative {
	const dy = new Array<number>(stateCount).fill(0);
	const effective = new Array<number>(STATE_COUNT).fill(0);
	const { yieldXS, maintenanceGPerGH, exhaustionGPerL, alpha, beta } = p;
	const o2 = p.oxygen;
	const kLa = o2?.kLaPerH ?? 0;
	const cStar = o2?.saturationMgPerL ?? 0;
	const oxygenPerBiomass = o2 ? 1000 / o2.yieldXO2 : 0;
	const oxygenMaintenance = o2?.maintenanceMgPerGH ?? 0;
	const dynamicOxygen = o2 !== null && !quasiSteadyOxygen;
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
		const y = quasiSteadyOxygen ? fillEffectiveState(p, true, state, effective) : state;
		const x = y[X];
		const s = y[S] > 0 ? y[S] : 0;
		const mu = computeGrowthRatePerH(p, y);
		const uptake = (mu / yieldXS + (maintenanceGPerGH * s) / (s + exhaustionGPerL)) * x;
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
		dy[S] = -uptake + substrateSupply;
		dy[P] = (alpha * mu + beta) * x - d * y[P];
		dy[V] = dV;
		dy[C] = dynamicOxygen
			? kLa * (cStar - y[C]) - (oxygenPerBiomass * mu + oxygenMaintenance) * x
			: 0;
		return dy;
	};
}

export const SIMULATION_MODEL_HELP = `## The culture model

**States**: biomass X (g/L), substrate S (g/L), product P (g/L), volume V (L) and, when an oxygen
block is given, dissolved oxygen C (mg/L).

**Growth** (Monod 1949): μ = μmax · S/(Ks + S) · C/(K_O + C). The oxygen factor (the multiplicative
"double Monod" form) applies only when K_O > 0 and an oxygen balance is solved.

**Balances**
- Biomass: dX/dt = μX − (F_in/V)·X. With perfusion the harvest stream passes a cell-retention device
  that holds back a fraction R of the cells and the bleed leaves with the culture's full biomass:
  dX/dt = μX − [b + (D − b)(1 − R)]·X.
- Substrate (maintenance after Pirt 1965): dS/dt = −(μ/Yx/s + m_s)·X + (F_in/V)(S_f − S). Maintenance can
  only draw on substrate that is there: m_s is multiplied by S/(S + S_ex), with S_ex the exhaustion
  threshold below; the factor is above 0.99 whenever S > 100·S_ex.
- Product (Luedeking & Piret 1959): dP/dt = (αμ + β)·X − (F_in/V)·P. Product passes the retention device.
- Volume: dV/dt = F_in − F_out.
- Oxygen (film theory): dC/dt = kLa(C* − C) − OUR with OUR = 1000·μX/Yx/O2 + m_O·X in mg O2/L/h
  (Yx/O2 in g biomass per g O2, m_O in mg O2 per g biomass per h). OUR and the maximum transfer rate
  kLa·C* are reported in mmol/L/h (O2 = 31.998 g/mol). Dilution of dissolved O2 by the feed is
  neglected (D ≪ kLa); a bolus or a draw-fill refill arrives air-saturated.
- DO is integrated as a state while it changes on a time scale the integrator can follow. Where it
  relaxes more than 1000 times faster than the culture can change (λ = kLa + ∂OUR/∂C above
  1000·max(μmax, D), as at O2 limitation with high biomass, where DO settles in milliseconds), the
  balance is solved at quasi-steady state instead, kLa(C* − C) = OUR(C); the lag this neglects, 1/λ
  against the culture's time scale, is 0.1 % or less. The result lists these stretches
  (quasiSteadyOxygenH); when one starts at t = 0 the given initial DO is replaced by the quasi-steady
  value.
- Without an oxygen block no oxygen balance is solved: the DO, OUR and OTR series are null and growth
  is never oxygen-limited. With an oxygen block, Yx/O2 is required.

**Modes**
- batch: no flows.
- fedBatch: F_out = 0; the feed follows one of the strategies below from its start time (or several
  feeds do, see below).
- chemostat: F_in = F_out = D·V, constant volume. Before the feed start time the vessel runs as a batch.
- perfusion: medium flows through at D·V; a bleed b·V leaves with the culture; the rest leaves through
  the retention device.
- drawFill: the vessel runs as a batch; every N hours (from the feed start time) a fraction of the
  volume is withdrawn and replaced with fresh medium, which scales X and P by (1 − fraction) and mixes S
  towards the medium's substrate.
- In chemostat, perfusion and draw-fill runs the feed block describes the fresh medium (its substrate,
  and its start time); the flow itself is set by the mode. A maximum working volume stops only
  fed-batch runs: the other modes keep the volume constant.

**Feeding strategies** (fed-batch; each starts at startH, with an optional bolus of feed at that time)
- constant: F = rate.
- linear: F = F0 + slope·(t − t0), never below 0 and never above the maximum rate if one is given.
- exponential: F = (μset/Yx/s + m_s)·X0·V0·e^{μset(t − t0)}/(S_f − S), X0·V0 at the feed start (textbook
  form; it holds S, and so μ, constant at μset once S is at the matching level).
- substrateStat: the feed meets the measured uptake and corrects the error proportionally,
  F = [q_S·X + k(S_set − S)]·V/(S_f − S) with k = 10·μmax, limited to 0 … maximum rate. While S is above
  the setpoint the law asks for a negative rate, so the feed stays off; below it S settles on the
  setpoint about ten times faster than the culture grows.
- doStat: F = F_max/(1 + e^{−(C − C_set)/w}), F_max the maximum rate, w = 1 % of C*: the feed runs
  at full rate while DO is well above the setpoint and is cut smoothly as DO falls below it (a steep
  logistic keeps the integrator's error control working). At steady control the biomass growth rate per volume is capped
  near Yx/O2·kLa·(C* − C_set).
- expression: F(t) is any arithmetic expression of t (h), X, S, P, V and DO (or C), with the usual math
  functions; assignments, function definitions and unknown names are refused. A negative or
  non-finite value stops the run with an error.

**Several feeds** (fed-batch): up to 8 streams, each with its own strategy, start time, bolus, maximum
rate and substrate concentration, and an optional label that names it in the events. Their rates add
up: F_in = Σ Fᵢ dilutes X and P and fills the vessel, and each brings its own substrate,
dS/dt = −q_S·X + Σ (Fᵢ/V)(S_f,i − S). A stream may carry none of the modelled substrate (S_f = 0, e.g.
an amino-acid feed; it then only dilutes), except exponential and substrate-stat streams, which need
S_f above the initial S. Each stream's law is the one above, computed for that stream alone: an
exponential stream meets the uptake by itself, and a substrate-stat stream sees only the uptake, so
the substrate the other streams bring (or their dilution) is left to its proportional term, which
leaves S off the setpoint by that supply divided by k. The result lists each stream's rate over time
and its delivered volume (bolus included), integrated with the run.

**Events**
- substrateExhausted: S falls below S_ex = min(1 % of Ks, 0.001 g/L).
- oxygenLimited: DO falls below 5 % of saturation, so transfer runs at ≥ 95 % of its maximum kLa·C*.
- oxygenDepleted: DO reaches zero (demand beyond kLa·C* with no K_O to slow growth); the run stops.
- maxVolumeReached: the volume reaches the maximum working volume; the run stops there (a later
  stream's bolus that would go beyond it is cut to the room left).
- feedStarted: a feed stream (named by its label when it has one) starts after t = 0 or with a bolus,
  or continuous operation starts after a batch phase.
- washout: in chemostat, perfusion or draw-fill runs, X falls below 1 % of its value when continuous
  operation began.

**Numerics**: the ODEX extrapolation integrator (Hairer & Wanner) with adaptive steps, absolute and
relative tolerance 1e-8 on every state, dense output at the requested times. Feed starts (each
stream's), boluses and draws split the run into segments integrated one after another. Values at an
output time that coincides with a draw or bolus are those just after it. A run the integrator cannot follow (more than 200 000
steps in one stretch, a non-finite value, or a concentration below −1e-6) fails with an error rather
than returning numbers.
`;
