// The sufficiency check's input and result shapes.
import { type ElementRole } from '../data/element-roles';
import { type ElementStatement, type ValueConfidence } from '../profile-elements';

export type SupplyBasis = 'element' | 'component';

/** Amount of one nutrient consumed per cell formed (over the run, not per hour). */
export interface PerCellConsumption {
	key: string;
	basis: SupplyBasis;
	pgPerCell?: number;
	/** mmol per 10^9 cells; needs a molar mass (an element's own, or molarMassGPerMol / formula). */
	mmolPer1e9Cells?: number;
	molarMassGPerMol?: number;
	formula?: string;
}

/** Per element: a role that overrides the default, and how sure the value is (see profile-elements.ts). */
export type ElementStatements = Record<string, ElementStatement>;

export type OrganismProfile =
	| { kind: 'preset'; id: string; elements?: ElementStatements }
	| {
			kind: 'elementalFractions';
			name?: string;
			fractions: Record<string, number>;
			cellDryMassPg?: number;
			elements?: ElementStatements;
			/** Ash-free biomass formula per C-mol: when given, the fractions are checked against it. */
			formula?: string;
			/** g ash per g dry biomass, for the check against the formula. */
			ashFraction?: number;
	  }
	| {
			kind: 'componentRequirements';
			name?: string;
			/** g component per g dry biomass. */
			requirementsGPerG: Record<string, number>;
			cellDryMassPg?: number;
	  }
	| {
			kind: 'perCell';
			name?: string;
			consumption: PerCellConsumption[];
			cellDryMassPg?: number;
			elements?: ElementStatements;
	  };

export type SufficiencyTarget =
	{ biomassGPerL: number } | { cellsPerMl: number; cellDryMassPg?: number };

/**
 * One source of nutrients (the basal medium, a feed, a bolus). `...GPerL` maps are concentrations in
 * this source when `volumeL` is given, otherwise already per litre of final volume (g/L-equivalent).
 * `...G` maps are total grams delivered.
 */
export interface SupplySource {
	name?: string;
	volumeL?: number;
	elementsGPerL?: Record<string, number>;
	componentsGPerL?: Record<string, number>;
	elementsG?: Record<string, number>;
	componentsG?: Record<string, number>;
}

export interface SupplyInput {
	/** Final culture volume, L; defaults to the sum of source volumes when every source has one. */
	finalVolumeL?: number;
	sources: SupplySource[];
}

/** How sure a yield is, and where it comes from; shown on its line. */
export interface YieldBasis {
	confidence?: ValueConfidence;
	source?: string;
}

export type CarbonDemand =
	| ({ basis: 'component'; component: string; yieldGPerG: number } & YieldBasis)
	| ({ basis: 'element'; yieldGPerGCarbon: number } & YieldBasis);

export interface SufficiencyInput {
	profile: OrganismProfile;
	target: SufficiencyTarget;
	supply: SupplyInput;
	/** Default 1.2 (common practice); at least 1. */
	safetyFactor?: number;
	/** Yield on the carbon source, so that respired carbon counts in the carbon demand. */
	carbon?: CarbonDemand;
	/**
	 * Yields on further substrates (e.g. glutamine, or the sole nitrogen salt): each becomes the line
	 * demand = X / Yx/s on that component, replacing any requirement the profile gives for it.
	 */
	substrates?: SubstrateDemand[];
	/** Elements not assessed; default ['H', 'O']. */
	ignoreElements?: string[];
}

export interface SubstrateDemand extends YieldBasis {
	component: string;
	yieldGPerG: number;
	/** How the yield was obtained, shown on the line. */
	note?: string;
}

export interface SufficiencyLine {
	key: string;
	basis: SupplyBasis;
	demandGPerL: number;
	supplyGPerL: number;
	/** Element lines, and components with a known molar mass. */
	demandMmolPerL: number | null;
	supplyMmolPerL: number | null;
	/** supply / demand. */
	ratio: number;
	/** supply − safetyFactor × demand, g/L; negative when short. */
	marginGPerL: number;
	sufficient: boolean;
	maxBiomassGPerL: number | null;
	maxCellsPerMl: number | null;
	/** 'required': a shortfall sets the limit; 'trace': a shortfall is a warning, never the limit. */
	role: ElementRole;
	/** 'default': the table of default roles (elements), or the rule that the carbon source, substrates and components are required; 'profile': the profile's own. */
	roleFrom: 'default' | 'profile';
	/** How sure the composition value (or yield) behind the demand is. */
	confidence: ValueConfidence;
	/** Where that value comes from, when known. */
	source: string | null;
	note?: string;
}

export interface SufficiencyResult {
	target: { biomassGPerL: number | null; cellsPerMl: number | null; cellDryMassPg: number | null };
	safetyFactor: number;
	finalVolumeL: number | null;
	lines: SufficiencyLine[];
	/** The required line of lowest ratio; trace lines never limit. */
	limiting: { key: string; basis: SupplyBasis; ratio: number } | null;
	maximumSupportable: { biomassGPerL: number | null; cellsPerMl: number | null };
	/** Every required line has supply ≥ safety factor × demand. */
	sufficient: boolean;
	/** Trace lines short of safety factor × demand, and fractions that contradict the formula. */
	warnings: string[];
	notes: string[];
	/** Where the default roles come from (common practice). */
	defaultRolesBasis: string;
}

export const DEFAULT_SAFETY_FACTOR = 1.2;

export const DEFAULT_IGNORED_ELEMENTS = ['H', 'O'] as const;

export interface Supply {
	finalVolumeL: number | null;
	element: Map<string, number>;
	component: Map<string, number>;
}

/** A line's role and the standing of its value. */
export type LineStanding = Pick<SufficiencyLine, 'role' | 'roleFrom' | 'confidence' | 'source'>;

export interface Requirement extends LineStanding {
	key: string;
	basis: SupplyBasis;
	demandGPerL: number;
	molarMassGPerMol: number | null;
	note?: string;
}

export interface Target {
	biomassGPerL: number | null;
	cellsPerMl: number | null;
	cellDryMassPg: number | null;
}
