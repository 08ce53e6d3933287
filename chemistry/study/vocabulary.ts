// The study vocabulary the science switches on; the app's pages and forms read it from here too
// (`$lib/studies` re-exports it with its labels).
export const ORGANISM_GROUPS = ['bacterium', 'yeast', 'mammalian'] as const;
export type OrganismGroup = (typeof ORGANISM_GROUPS)[number];

export const PROFILE_KINDS = ['elementalFractions', 'componentRequirements', 'perCell'] as const;
export type ProfileKind = (typeof PROFILE_KINDS)[number];

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

/** Where a vessel's kLa comes from: typed in, a correlation with the user's constants, or the vessel's measured map. */
export const VESSEL_KLA_MODES = ['entered', 'correlation', 'map'] as const;
export type VesselKlaMode = (typeof VESSEL_KLA_MODES)[number];

export const TARGET_BASES = ['biomassGPerL', 'cellsPerMl'] as const;
export type TargetBasis = (typeof TARGET_BASES)[number];

export const FEED_PLAN_STRATEGIES = [
	'constant',
	'linear',
	'exponential',
	'substrateStat',
	'doStat'
] as const;
export type FeedPlanStrategy = (typeof FEED_PLAN_STRATEGIES)[number];
const CONTROLLED_FEED_PLANS: readonly string[] = ['substrateStat', 'doStat'];

/** A plan whose rate follows the culture: its volume is what is available, not what is delivered. */
export function isControlledPlan(strategy: string): boolean {
	return CONTROLLED_FEED_PLANS.includes(strategy);
}

/** How one feed is fed: its plan, its start and the plan's own settings. */
export interface FeedPlan {
	strategy: FeedPlanStrategy;
	startH: number;
	muSetPerH: number | null;
	setpointGPerL: number | null;
	doSetpointPercent: number | null;
	maxRateLPerH: number | null;
}
