import type { Role } from './roles';

// Study vocabulary shared by server and pages; no server code here.
export const ORGANISM_GROUPS = ['bacterium', 'yeast', 'mammalian'] as const;
export type OrganismGroup = (typeof ORGANISM_GROUPS)[number];
export const ORGANISM_GROUP_LABELS: Record<OrganismGroup, string> = {
	bacterium: 'Bacterium',
	yeast: 'Yeast',
	mammalian: 'Mammalian cell line'
};

export const PROFILE_KINDS = ['elementalFractions', 'componentRequirements', 'perCell'] as const;
export type ProfileKind = (typeof PROFILE_KINDS)[number];
export const PROFILE_KIND_LABELS: Record<ProfileKind, string> = {
	elementalFractions: 'Elemental mass fractions (g element per g dry biomass)',
	componentRequirements: 'Component requirements (g component per g dry biomass)',
	perCell: 'Per-cell consumption (cell culture)'
};

/** How Yx/s on the carbon source is obtained. */
export const YIELD_METHODS = ['entered', 'respiratoryQuotient', 'oxygenYield'] as const;
export type YieldMethod = (typeof YIELD_METHODS)[number];
export const YIELD_METHOD_LABELS: Record<YieldMethod, string> = {
	entered: 'Entered (measured)',
	respiratoryQuotient: 'Element balance from a measured RQ',
	oxygenYield: 'Element balance from Yx/O2 (or qO2 at μmax)'
};

/** A yield on a further substrate: typed in, or from the balance of an element it alone supplies. */
export type SubstrateYieldEntry =
	| { componentId: string; method: 'entered'; yieldGPerG: number }
	| { componentId: string; method: 'soleSource'; element: string; yieldGPerG: number };

export const TARGET_BASES = ['biomassGPerL', 'cellsPerMl'] as const;
export type TargetBasis = (typeof TARGET_BASES)[number];
export const TARGET_BASIS_UNITS: Record<TargetBasis, string> = { biomassGPerL: 'g/L dry biomass', cellsPerMl: 'cells/mL' };

export const FEED_PLAN_STRATEGIES = ['constant', 'linear', 'exponential'] as const;
export type FeedPlanStrategy = (typeof FEED_PLAN_STRATEGIES)[number];
export const FEED_PLAN_LABELS: Record<FeedPlanStrategy, string> = {
	constant: 'Constant rate',
	linear: 'Linearly rising rate (from 0)',
	exponential: 'Exponential rate'
};

/** Who sees and edits studies, organism profiles and vessels. */
export const STUDY_ROLES = ['engineer', 'media_scientist'] as const satisfies readonly Role[];
