// The growth balance's input and result shapes, and the limits and roles the reading and solving share.

export type SpeciesRole =
	'substrate' | 'nitrogen' | 'oxygen' | 'biomass' | 'carbonDioxide' | 'water' | 'product';

export const ROLES: readonly SpeciesRole[] = [
	'substrate',
	'nitrogen',
	'oxygen',
	'biomass',
	'carbonDioxide',
	'water',
	'product'
];

export interface StoichiometrySpecies {
	id: string;
	formula: string;
	/** Ash mass fraction of dry biomass (0 ≤ a < 1); marks the species as biomass. */
	ashFraction?: number;
	role?: SpeciesRole;
}

/** `relativeError` is the relative standard error used in the consistency test; default 0.05. */
export type StoichiometrySpecification =
	| { kind: 'rate'; species: string; mol: number; relativeError?: number }
	| { kind: 'massYield'; product: string; substrate: string; gPerG: number; relativeError?: number }
	| {
			kind: 'molarRatio';
			numerator: string;
			denominator: string;
			value: number;
			relativeError?: number;
	  };

export interface StoichiometryInput {
	species: StoichiometrySpecies[];
	/** Elements to balance, from C, H, O, N, P, S; default C, H, O, N. */
	elements?: string[];
	specifications: StoichiometrySpecification[];
	/** Confidence level of the consistency test; default 0.95. */
	consistencyConfidence?: number;
}

export interface SpeciesRate {
	/** mol, or C-mol for biomass. */
	mol: number;
	/** g; for biomass dry weight including ash. */
	g: number;
	/** C-mol for carbon species, null otherwise. */
	cmol: number | null;
}

export interface StoichiometryYields {
	/** The first substrate (in species order) that is consumed, or null. */
	firstSubstrate: string | null;
	/** Yx/s in g/g on the first substrate. */
	biomassOnSubstrateGPerG: number | null;
	biomassOnSubstrateCmolPerCmol: number | null;
	/** Per consumed substrate: Yx/s and every product's yield, g/g. */
	perSubstrate: Record<
		string,
		{
			biomassGPerG: number | null;
			biomassCmolPerCmol: number | null;
			productsGPerG: Record<string, number>;
		}
	>;
	/** Yx/O2, g dry biomass per g O2. */
	biomassOnOxygenGPerG: number | null;
	/** g O2 per g dry biomass (1/Yx/O2). */
	oxygenPerBiomassGPerG: number | null;
	/** RQ: mol CO2 produced per mol O2 consumed. */
	respiratoryQuotient: number | null;
}

export interface ElectronBalance {
	/** γ (per unit) × r for each species, mol electrons; Σ is 0 when the balance closes. */
	terms: Record<string, number>;
	sum: number;
	/** |Σ γr| / Σ |γr|. */
	relativeResidual: number;
	closes: boolean;
	/** Electrons available in the consumed substrates, Σ γ|r|, mol. */
	availableFromSubstratesMol: number;
	/** Share of the substrate electrons ending in each other species (biomass η, O2 ε, products). */
	fractions: Record<string, number>;
}

export interface SpecificationDeviation {
	index: number;
	kind: StoichiometrySpecification['kind'];
	given: number;
	fitted: number;
	/** (fitted − given)/given; absolute (relative to the largest rate) when given is 0. */
	relativeDeviation: number;
	relativeError: number;
}

export interface StoichiometryConsistency {
	redundancy: number;
	/** h = Σ (δ/σ)². */
	chiSquare: number;
	threshold: number;
	confidence: number;
	pValue: number;
	consistent: boolean;
	deviations: SpecificationDeviation[];
}

export interface StoichiometryResult {
	elements: string[];
	rates: Record<string, SpeciesRate>;
	/** Role as given, inferred from the formula, or from the solved direction (null: zero rate). */
	roles: Record<string, SpeciesRole | null>;
	/** g/mol; for biomass g per C-mol of dry weight (ash included). */
	molarMasses: Record<string, number>;
	yields: StoichiometryYields;
	/** Per C-mol for carbon species, per mole otherwise (C +4, H +1, O −2, N −3, P +5, S +6). */
	degreesOfReduction: Record<string, number>;
	electronBalance: ElectronBalance;
	/** E·r per element, mol. */
	elementResiduals: Record<string, number>;
	degreesOfFreedom: number;
	redundancy: number;
	independentSpecifications: number;
	consistency?: StoichiometryConsistency;
	notes: string[];
}

export const DEFAULT_BALANCE_ELEMENTS = ['C', 'H', 'O', 'N'] as const;

/** Relative standard error of a specification when none is given (common practice: 2–5 %). */
export const DEFAULT_RELATIVE_ERROR = 0.05;

export interface Species {
	id: string;
	index: number;
	formula: string;
	/** Atoms per unit: per C-mol for biomass. */
	elements: Record<string, number>;
	role: SpeciesRole | undefined;
	roleGiven: boolean;
	ashFraction: number;
	molarMass: number;
	carbon: number;
}

export interface Spec {
	index: number;
	kind: StoichiometrySpecification['kind'];
	a: number;
	b: number;
	value: number;
	relativeError: number;
}

export const CONSUMED: ReadonlySet<SpeciesRole> = new Set(['substrate', 'nitrogen', 'oxygen']);

export const PRODUCED: ReadonlySet<SpeciesRole> = new Set(['biomass', 'carbonDioxide', 'product']);
