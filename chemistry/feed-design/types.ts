// The feed designer's input and result shapes, its defaults, and the internal shapes its parts share.
import { type ComponentSpec } from '../components';
import { type CompositionWarning, type PrecipitationSpecies } from '../composition';

export interface FeedCandidate {
	component: ComponentSpec;
	/**
	 * The form needs stated per component also count this one as (the free amino acid of a salt, the
	 * anhydrous salt of a hydrate), with its molar mass.
	 */
	basis?: { id: string; molarMassGPerMol: number } | null;
}

export interface FeedNeed {
	/** Element symbol or component id, as the sufficiency lines name it. */
	key: string;
	name: string;
	/** Safety factor × demand, g per litre of the culture's final volume. */
	requiredGPerLFinal: number;
	/** What the basal medium already brings, g. */
	presentG: number;
}

export interface FeedLimits {
	/** The recipe analysis's osmolality estimate, per feed. */
	osmolalityMaxMOsmPerKg: number;
	/** Σ g/L of the lines as weighed, per feed. */
	dissolvedSolidsMaxGPerL: number;
}

export interface FeedDesignInput extends FeedLimits {
	candidates: FeedCandidate[];
	needs: FeedNeed[];
	/** Culture volume before feeding, L. */
	initialVolumeL: number;
	/** All feeds together, L. */
	feedVolumeL: number;
	/** Room left in the vessel for feed, L. */
	maxFeedVolumeL: number;
	temperatureC: number;
}

export type FeedLimitBasis = 'microbial' | 'cellCulture';

/**
 * Limits offered when the user sets none. Rules of thumb, not published values: they bound the
 * recipe analysis's estimate (mOsm/L read as mOsm/kg), which runs low for concentrated feeds.
 */
export const FEED_LIMIT_DEFAULTS: Readonly<
	Record<FeedLimitBasis, FeedLimits & { source: string }>
> = Object.freeze({
	microbial: {
		osmolalityMaxMOsmPerKg: 4000,
		dissolvedSolidsMaxGPerL: 700,
		source:
			'Common practice, from memory: microbial fed-batch feeds go up to about 600–700 g/L glucose, which the estimate puts near 3,400–3,900 mOsm/kg, and more dissolved solids make a feed too viscous to pump evenly.'
	},
	cellCulture: {
		osmolalityMaxMOsmPerKg: 1500,
		dissolvedSolidsMaxGPerL: 300,
		source:
			"Common practice, from memory: concentrated cell-culture feeds are usually held to about 1,000–1,500 mOsm/kg so that each addition raises the culture's osmolality only a little; 300 g/L dissolved solids is a working ceiling chosen here, not a published value."
	}
});

export interface DesignedFeedLine {
	componentId: string;
	name: string;
	gPerL: number;
	massG: number;
	/** Of this form at the feed temperature; null without library data. */
	solubilityGPerL: number | null;
	atSolubilityLimit: boolean;
}

export interface DesignedFeed {
	key: 'single' | 'cations' | 'anions';
	label: string;
	/** What it carries and how to keep it, in plain words. */
	description: string;
	volumeL: number;
	lines: DesignedFeedLine[];
	/** From computeComposition on the lines: the numbers the recipe preview shows for this feed. */
	osmolalityMOsmPerKg: number;
	dissolvedSolidsGPerL: number;
	warnings: Pick<CompositionWarning, 'kind' | 'basis' | 'message' | 'precipitate'>[];
}

export interface FeedCoverage {
	key: string;
	name: string;
	neededG: number;
	providedG: number;
	coveredByBasal: boolean;
}

export interface FeedDesignResult extends FeedLimits {
	feasible: boolean;
	feedVolumeL: number;
	maxFeedVolumeL: number;
	temperatureC: number;
	feeds: DesignedFeed[];
	/** Why one feed would not do: the analysis's precipitation warnings for it. */
	split: { precipitates: string[]; warnings: string[] } | null;
	coverage: FeedCoverage[];
	/** Why it cannot be done, one sentence each; empty when feasible. */
	problems: string[];
	notes: string[];
	/** The least feed volume that would work with these components and limits; null when none does. */
	minimumFeedVolumeL: number | null;
}

/** Every limit in the program sits this much below the user's, so 4-figure rounding stays within it. */
export const LIMIT_MARGIN = 2e-3;

/** g/L on the lines: 4 significant figures, rounded up so every need stays met. */
export const LINE_FIGURES = 4;

/**
 * A tie-break cost per mg: what neither side of a pair carries (glucose, ammonium, amino acids) goes with the
 * phosphate, so the Ca/Mg/Fe feed stays a small salt feed; it moves over only when the limits need the room.
 */
export const NEUTRAL_IN_CATION_FEED_COST = 1e-4;

export type Side = 'cation' | 'anion' | 'both' | 'neutral';

export interface Prepared {
	index: number;
	spec: ComponentSpec;
	/** g of each nutrient per g of the component. */
	content: Map<string, number>;
	/** Of this form, g/L at the feed temperature. */
	solubilityGPerL: number | null;
	/** mOsm/L per g/L, exactly as computeComposition counts it; 0 without a molar mass. */
	osmolalityPerGPerL: number;
	hasMolarMass: boolean;
	species: Set<PrecipitationSpecies>;
	side: Side;
}

export interface Slot {
	key: DesignedFeed['key'];
	members: number[];
}

/** Solubility always binds; the osmolality and solids limits can be left out to find which one fails. */
export interface Limits {
	osmolality: number | null;
	solids: number | null;
}

export type Volume = { fixedL: number } | { maxL: number | null };

export interface LpSolution {
	/** [slot][candidate] in mg. */
	massMg: number[][];
	volumeL: number[];
}
