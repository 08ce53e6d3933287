import type { SimulationEvent } from '../simulation';
import type { ElementStatements, PerCellConsumption, SufficiencyLine } from '../sufficiency';
import type { Runout } from './nutrient-runout';
import type {
	FeedPlan,
	FeedPlanStrategy,
	OrganismGroup,
	ProfileKind,
	SubstrateYieldEntry,
	TargetBasis,
	VesselKlaMode,
	YieldMethod
} from './vocabulary';
import type { KlaCorrelationFit } from '../kla-correlation';
import type { VesselGeometry } from '../kla/operating-point';

/** What one recipe version puts into a litre of itself. */
export interface SupplyComposition {
	elementsGPerL: Record<string, number>;
	/** Each component by id, plus the molar equivalent of its basis form (salt → free amino acid). */
	componentsGPerL: Record<string, number>;
}

export interface StudySource {
	versionId: string;
	label: string;
	composition: SupplyComposition;
	/** Feeds only: planned volume over the run. */
	volumeL?: number;
	temperatureC: number;
}

export type StudyFeedSource = StudySource & { volumeL: number; plan: FeedPlan };

/** The study's own settings, as saved. */
export interface StudyPlan {
	name: string;
	targetBasis: TargetBasis;
	/** g/L dry biomass or cells/mL, by `targetBasis`. */
	targetValue: number;
	initialVolumeL: number;
	/** In the same basis as the target. */
	inoculumDensity: number;
	durationH: number;
	temperatureC: number;
	pressureKPa: number;
	o2MoleFraction: number;
	doSetpointPercent: number;
	safetyFactor: number;
	/** Oxycaloric factor, kJ/mol O2; null: the library default. */
	heatPerMolO2KJ: number | null;
	/** Stirrer speed and gas flow of the plan, for a kLa from the vessel's map; null: the vessel's planned operation. */
	plannedAgitationRpm?: number | null;
	plannedGasFlowLPerMin?: number | null;
	notes: string;
}

/** What the science reads of an organism profile. */
export interface StudyProfile {
	name: string;
	group: OrganismGroup;
	kind: ProfileKind;
	biomassFormula: string | null;
	ashFraction: number | null;
	/** g element per g dry biomass. */
	elementalFractions: Record<string, number> | null;
	fractionsSource: string | null;
	elementStatements?: ElementStatements | null;
	/** g component per g dry biomass. */
	componentRequirements: Record<string, number> | null;
	perCellConsumption: PerCellConsumption[] | null;
	cellDryMassPg: number | null;
	carbonSourceId: string | null;
	yieldXSGPerG: number | null;
	yieldXSMethod: YieldMethod;
	respiratoryQuotient: number | null;
	substrateYields: SubstrateYieldEntry[];
	muMaxPerH: number | null;
	ksGPerL: number | null;
	maintenanceGPerGH: number | null;
	yieldXO2GPerG: number | null;
	qO2MmolPerGH: number | null;
}

/** What the science reads of a vessel. */
export interface StudyVessel {
	name: string;
	minWorkingVolumeL: number;
	maxWorkingVolumeL: number;
	kLaMode: VesselKlaMode;
	kLaPerH: number | null;
	/** kLa = k·(P/V)^a·(v_s)^b (van 't Riet 1979), P/V in W/m³, v_s in m/s; constants from the user. */
	correlationK: number | null;
	correlationA: number | null;
	correlationB: number | null;
	powerPerVolumeWPerM3: number | null;
	superficialVelocityMPerS: number | null;
	o2EnrichmentAllowed: boolean;
	/** Absolute pressure rating of the headspace, kPa. */
	maxPressureKPa: number;
	coolingCapacityW: number;
	agitationPowerW: number | null;
	/** the vessel's fitted kLa map and where studies run it; null without three measured points */
	klaMap: VesselKlaMap | null;
}

/** A vessel's measured kLa map, fitted (chemistry/kla-correlation.ts), and its planned operating point. */
export interface VesselKlaMap {
	correlation: Pick<KlaCorrelationFit, 'k' | 'a' | 'b' | 'measuredRange'>;
	pointCount: number;
	geometry: VesselGeometry | null;
	plannedAgitationRpm: number | null;
	plannedGasFlowLPerMin: number | null;
}

/** Everything an evaluation reads, already loaded: evaluation itself touches no database. */
export interface StudyInputs {
	plan: StudyPlan;
	basal: StudySource;
	feeds: StudyFeedSource[];
	profile: StudyProfile;
	vessel: StudyVessel;
	componentNames: Record<string, string>;
	/** Component formulas, for the element balance that can give Yx/O2. */
	componentFormulas: Record<string, string | null>;
}

/** The what-if: values that replace the saved study's for one evaluation. */
export interface WhatIf {
	targetValue?: number;
	/** Total feed volume, L; every feed is scaled in proportion. */
	feedVolumeL?: number;
	kLaPerH?: number;
	o2MoleFraction?: number;
	temperatureC?: number;
}

export interface DefaultUsed {
	what: string;
	value: string;
	source: string;
}

export type Check = 'ok' | 'short';

export interface NutrientRow extends SufficiencyLine {
	name: string;
	/** When the simulated run has taken all of it (and when a feed covers it again); null when it lasts, and for the modelled carbon source. */
	runout: Runout | null;
	/**
	 * Why `runout` is null: the carbon source is modelled in the time course, the nutrient lasts the
	 * run, or there is no time course; null when there is a run-out.
	 */
	noRunout: 'modelled' | 'lasts' | 'no time course' | null;
}

/** Where the required nutrients hold the time course's growth back. */
export interface TimeCourseHold {
	/** When a required nutrient first holds growth back, h. */
	fromH: number;
	/** That nutrient's name. */
	nutrient: string;
	/** X as the model gives it on the carbon source alone, g/L; the course's X is held below it from `fromH`. */
	carbonOnlyBiomassGPerL: number[];
	/**
	 * The most X the required nutrients allow at each output time, g/L: what they have supplied by
	 * then, at their demand per g of biomass (no safety factor), in the volume at that time.
	 */
	allowedGPerL: number[];
}

export interface FeedReport {
	label: string;
	versionId: string;
	strategy: FeedPlanStrategy;
	startH: number;
	/** Substrate- or DO-stat: the rate follows the culture and `volumeL` is what is available. */
	controlled: boolean;
	volumeL: number;
	/** What the simulated run drew; null without a time course. */
	deliveredL: number | null;
	/** What the nutrient table counts. */
	usedL: number;
	/** A controlled feed that has given all it has; null when it lasts. */
	emptyAtH: number | null;
}

export interface TimeCourse {
	t: number[];
	biomassGPerL: number[];
	substrateGPerL: number[];
	volumeL: number[];
	dissolvedOxygenMgPerL: number[];
	ourMmolPerLH: number[];
	/** kLa·C* of the run, mmol/L/h: what transfer supplies with DO at 0 */
	maxOtrMmolPerLH: number | null;
	/** Stretches with DO at 0, where growth ran at what transfer supplies. */
	oxygenLimitedH: { fromH: number; toH: number }[];
	events: SimulationEvent[];
	finalBiomassGPerL: number;
	reachesTarget: boolean;
	/** When biomass first reaches the target (interpolated); null when it does not. */
	targetReachedAtH: number | null;
	stoppedAtH: number | null;
}

export interface StudyReport {
	verdict: 'supported' | 'not supported';
	/** Why not, one sentence each; empty when supported. */
	reasons: string[];
	/** What holds in total but not all along, e.g. a nutrient used up before a feed brings more. */
	warnings: string[];
	inputs: {
		targetValue: number;
		targetBasis: TargetBasis;
		targetBiomassGPerL: number;
		targetCellsPerMl: number | null;
		feedVolumeL: number;
		kLaPerH: number;
		kLaOrigin: string;
		o2MoleFraction: number;
		temperatureC: number;
		pressureKPa: number;
		doSetpointPercent: number;
		safetyFactor: number;
	};
	limit: {
		key: string;
		name: string;
		basis: 'element' | 'component';
		ratio: number;
		maxBiomassGPerL: number | null;
		maxCellsPerMl: number | null;
	};
	nutrients: { check: Check; lines: NutrientRow[]; notes: string[] };
	oxygen: {
		check: Check;
		totalO2G: number;
		totalO2Mol: number;
		yieldXO2GPerG: number;
		/** the O2 demand of the plan as written (growth not held back by transfer) */
		peakOurMmolPerLH: number;
		/** null when the plan could not be simulated and the peak is an estimate */
		peakOurAtH: number | null;
		peakOurOrigin: string;
		/** the run could not cover the whole plan (it filled the vessel, or failed): the demand can only be higher */
		lowerBound: boolean;
		maxOtrMmolPerLH: number;
		utilisation: number;
		saturationMgPerL: number;
		setpointMgPerL: number;
		kLaNeededPerH: number;
		/** kLa needed rounded up to 3 significant digits: typed back in, it meets the demand */
		kLaRecommendedPerH: number;
		o2MoleFractionNeeded: number;
		o2MoleFractionRecommended: number;
		enrichmentFeasible: boolean;
		enrichmentAllowed: boolean;
		reserveS: number | null;
	};
	heat: {
		check: Check;
		heatLoadW: number;
		metabolicW: number;
		agitationPowerW: number;
		coolingCapacityW: number;
		utilisation: number;
		heatPerMolO2KJ: number;
		lowerBound: boolean;
	};
	volume: {
		check: Check;
		initialL: number;
		feedL: number;
		finalL: number;
		minL: number;
		maxL: number;
	};
	feeds: FeedReport[];
	/**
	 * The plan in this vessel (oxygen may hold growth back) with its biomass held to what the required
	 * nutrients supply (`nutrientHold`), and the demand run's OUR beside it.
	 */
	timeCourse:
		| ({
				check: Check;
				demandOurMmolPerLH: number[] | null;
				nutrientHold: TimeCourseHold | null;
		  } & TimeCourse)
		| { check: 'unavailable'; message: string };
	defaults: DefaultUsed[];
	notes: string[];
	cautions: string[];
}
