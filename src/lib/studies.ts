import {
	ORGANISM_GROUPS,
	PROFILE_KINDS,
	YIELD_METHODS,
	YIELD_METHOD_LABELS,
	TARGET_BASES,
	FEED_PLAN_STRATEGIES,
	VESSEL_KLA_MODES,
	isControlledPlan,
	type OrganismGroup,
	type ProfileKind,
	type YieldMethod,
	type SubstrateYieldEntry,
	type TargetBasis,
	type FeedPlanStrategy,
	type FeedPlan,
	type VesselKlaMode
} from '$chemistry';

// Study vocabulary shared by server and pages; no server code here. The lists and types the science
// switches on live in chemistry/study/vocabulary.ts; their labels live here.
export {
	ORGANISM_GROUPS,
	PROFILE_KINDS,
	YIELD_METHODS,
	YIELD_METHOD_LABELS,
	TARGET_BASES,
	FEED_PLAN_STRATEGIES,
	VESSEL_KLA_MODES,
	isControlledPlan
};
export type {
	OrganismGroup,
	ProfileKind,
	YieldMethod,
	SubstrateYieldEntry,
	TargetBasis,
	FeedPlanStrategy,
	FeedPlan,
	VesselKlaMode
};

export const ORGANISM_GROUP_LABELS: Record<OrganismGroup, string> = {
	bacterium: 'Bacterium',
	yeast: 'Yeast',
	mammalian: 'Mammalian cell line'
};

export const PROFILE_KIND_LABELS: Record<ProfileKind, string> = {
	elementalFractions: 'Elemental mass fractions (g element per g dry biomass)',
	componentRequirements: 'Component requirements (g component per g dry biomass)',
	perCell: 'Per-cell consumption (cell culture)'
};

export const TARGET_BASIS_UNITS: Record<TargetBasis, string> = {
	biomassGPerL: 'g/L dry biomass',
	cellsPerMl: 'cells/mL'
};

export const FEED_PLAN_LABELS: Record<FeedPlanStrategy, string> = {
	constant: 'Constant rate',
	linear: 'Linearly rising rate (from 0)',
	exponential: 'Exponential rate',
	substrateStat: 'Substrate-stat (holds the carbon source at a setpoint)',
	doStat: 'DO-stat (feeds while DO is above a setpoint)'
};

/** One feed's plan in words, e.g. "DO-stat above 40 % DO, at most 0.15 L/h, from 8 h; 1.5 L available". */
export function describeFeedPlan(plan: FeedPlan, volumeL: number): string {
	const from = `from ${plan.startH} h`;
	switch (plan.strategy) {
		case 'constant':
			return `constant rate ${from}; ${volumeL} L planned`;
		case 'linear':
			return `linearly rising rate ${from}; ${volumeL} L planned`;
		case 'exponential':
			return `exponential, μset ${plan.muSetPerH} /h, ${from}; ${volumeL} L planned`;
		case 'substrateStat':
			return `substrate-stat at ${plan.setpointGPerL} g/L, at most ${plan.maxRateLPerH} L/h, ${from}; ${volumeL} L available`;
		case 'doStat':
			return `DO-stat above ${plan.doSetpointPercent} % DO, at most ${plan.maxRateLPerH} L/h, ${from}; ${volumeL} L available`;
	}
}

/** One "N 0.14" (or "N=0.14", "N: 0.14") entry of the elemental-fraction and requirement boxes. */
const PAIR_PATTERN = /^([^\s=:]+)\s*[=:\s]\s*(.+)$/;
/** One "l-glutamine 3 mmol" (per 10⁹ cells) or "d-glucose 350 pg" (per cell) line of the per-cell box. */
export const CONSUMPTION_PATTERN = /^(\S+)\s+([\d.,eE+-]+)\s*(mmol|pg)$/;

/** The entries of a fraction or requirement box, one per line or comma; `pair` is null for a line that is not "name number". */
export function splitPairEntries(text: string): { entry: string; pair: [string, string] | null }[] {
	return text
		.split(/[\n,;]+/)
		.map((l) => l.trim())
		.filter(Boolean)
		.map((entry) => {
			const m = PAIR_PATTERN.exec(entry);
			return { entry, pair: m ? [m[1], m[2].trim()] : null };
		});
}

/**
 * The element symbols typed in the fraction box and among the per-cell lines, in order, as the
 * profile form lists them for their role and confidence. `isElement` tells a symbol from a component id.
 */
export function listTypedElements(
	fractionsText: string,
	consumptionText: string,
	isElement: (symbol: string) => boolean
): string[] {
	const fromFractions = splitPairEntries(fractionsText).flatMap(({ pair }) =>
		pair && isElement(pair[0]) ? [pair[0]] : []
	);
	const fromCells = consumptionText
		.split('\n')
		.map((l) => CONSUMPTION_PATTERN.exec(l.trim()))
		.flatMap((m) => (m && isElement(m[1]) ? [m[1]] : []));
	return [...new Set([...fromFractions, ...fromCells])];
}
