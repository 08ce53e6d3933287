// Request and result shapes of the process simulation; `POST /api/v1/simulate` passes its body straight through.

export type OperatingMode = 'batch' | 'fedBatch' | 'chemostat' | 'perfusion' | 'drawFill';

export type FeedStrategy =
	'constant' | 'linear' | 'exponential' | 'substrateStat' | 'doStat' | 'expression';

export interface KineticsInput {
	muMaxPerH: number;
	ksGPerL: number;
	/** g biomass per g substrate */
	yieldXS: number;
	/** substrate for maintenance, g substrate per g biomass per h (Pirt) */
	maintenanceGPerGH?: number;
	/**
	 * g biomass per g O2; required when `oxygen` is given. Without `oxygen`, the result's
	 * `ourMmolPerLH` is the O2 demand of the simulated growth (transfer unlimited).
	 */
	yieldXO2?: number;
	/**
	 * O2 half-saturation constant: above 0, growth slows as DO falls (C/(K_O + C)); at 0, growth runs at
	 * full speed until DO reaches 0 and then at the rate transfer can supply
	 */
	koMgPerL?: number;
	/** Luedeking–Piret growth-associated term, g product per g biomass */
	alpha?: number;
	/** Luedeking–Piret non-growth term, g product per g biomass per h */
	beta?: number;
}

export interface InitialStateInput {
	biomassGPerL: number;
	substrateGPerL: number;
	volumeL: number;
	/** defaults to `oxygen.saturationMgPerL` */
	dissolvedOxygenMgPerL?: number;
	productGPerL?: number;
}

export interface FeedInput {
	strategy: FeedStrategy;
	/** fed-batch only: names the stream in events and in `feedStreams`; at most 80 characters */
	label?: string;
	/**
	 * substrate in the feed (or the fresh medium in chemostat, perfusion and draw-fill); a stream of
	 * `feeds` may carry none (0) unless it is exponential or substrate-stat
	 */
	substrateGPerL: number;
	rateLPerH?: number;
	slopeLPerH2?: number;
	muSetPerH?: number;
	setpointGPerL?: number;
	doSetpointMgPerL?: number;
	expression?: string;
	startH?: number;
	bolusL?: number;
	maxRateLPerH?: number;
}

export interface OxygenInput {
	kLaPerH: number;
	saturationMgPerL: number;
	/** O2 for maintenance, mg O2 per g biomass per h */
	maintenanceMgPerGH?: number;
	/**
	 * default true. false: DO is followed (a DO-stat feed reads it, and it is held at 0 where transfer
	 * falls short) but never slows growth, so `ourMmolPerLH` is the demand of the plan as written, not
	 * what this kLa supplies; K_O must then be absent
	 */
	limitsGrowth?: boolean;
}

export interface PerfusionInput {
	/** fraction of cells the retention device holds back from the harvest stream, 0–1 */
	retentionEfficiency: number;
	/** cell bleed, vessel volumes per hour (leaves with the culture's full biomass) */
	bleedPerH: number;
}

export interface DrawFillInput {
	/** fraction of the working volume withdrawn and replaced with fresh medium at each draw */
	fraction: number;
	everyH: number;
}

export interface SimulationRequest {
	mode: OperatingMode;
	kinetics: KineticsInput;
	initial: InitialStateInput;
	feed?: FeedInput;
	/** fedBatch only, instead of `feed`: 1 to 8 streams, each with its own strategy and start */
	feeds?: FeedInput[];
	oxygen?: OxygenInput;
	perfusion?: PerfusionInput;
	drawFill?: DrawFillInput;
	dilutionPerH?: number;
	maxVolumeL?: number;
	endH: number;
	outputEveryH: number;
}

export type SimulationEventKind =
	| 'substrateExhausted'
	| 'oxygenLimited'
	| 'oxygenDepleted'
	| 'maxVolumeReached'
	| 'washout'
	| 'feedStarted'
	| 'draw';

export interface SimulationEvent {
	kind: SimulationEventKind;
	tH: number;
	message: string;
}

export interface IntegratorTolerances {
	absolute: number;
	relative: number;
}

export interface FeedStreamResult {
	label: string | null;
	strategy: FeedStrategy;
	/** this stream's rate at each output time (0 before its start) */
	feedLPerH: number[];
	/** volume the stream added over the run, its bolus included (integrated with the run, not from the outputs) */
	deliveredL: number;
}

export interface SimulationResult {
	t: number[];
	biomassGPerL: number[];
	substrateGPerL: number[];
	productGPerL: number[];
	volumeL: number[];
	/** null when the request has no `oxygen` block: no O2 balance is solved */
	dissolvedOxygenMgPerL: number[] | null;
	/**
	 * inflow at each output time (the sum of the feed streams, or dilution/perfusion flow); draws are
	 * discrete and not shown
	 */
	feedLPerH: number[];
	/** fed-batch: each feed stream in request order (the single `feed` as one); null in other modes */
	feedStreams: FeedStreamResult[] | null;
	/**
	 * with `oxygen`, the uptake (limited by transfer where DO reaches 0); without `oxygen` but with
	 * `kinetics.yieldXO2`, the demand of the simulated growth; otherwise null
	 */
	ourMmolPerLH: number[] | null;
	maxOtrMmolPerLH: number[] | null;
	events: SimulationEvent[];
	tolerances: IntegratorTolerances;
	/**
	 * Stretches of the run in which DO relaxed so fast that its balance was solved at quasi-steady
	 * state (dC/dt = 0) rather than integrated; null without an oxygen block.
	 */
	quasiSteadyOxygenH: { fromH: number; toH: number }[] | null;
	/**
	 * Stretches in which DO was held at 0 and growth ran at what transfer supplies (OTR = OUR at
	 * DO = 0); null without an oxygen block.
	 */
	oxygenLimitedH: { fromH: number; toH: number }[] | null;
	/** set when the run ended before `endH` (the maximum working volume reached) */
	stoppedAtH?: number;
	integratorSteps: { accepted: number; rejected: number; evaluations: number };
}
