/**
 * Feed design: the least total mass of candidate components that, added as one or two feed
 * concentrates, brings every nutrient a culture still needs after its basal medium — within each
 * component's solubility at the feed temperature, an osmolality limit and a dissolved-solids limit
 * per feed. Every proposed feed is then put through `computeComposition`, the recipe analysis's own
 * engine, and a precipitation pair it flags in one feed splits the proposal in two: the Ca/Mg/Fe
 * salts in one feed, phosphate and carbonate in the other.
 *
 * A linear program (javascript-lp-solver) in mg and L: every limit is linear in the masses and the
 * feed volumes (g/L ≤ S ⟺ mass ≤ S·volume), so the volumes of a split can be variables too.
 */
import solver from 'javascript-lp-solver';
import { ChemistryInputError } from './errors';
import { type ComponentSpec, resolveComponent, solubilityAt } from './components';
import {
	PRECIPITATION_RULES,
	computeComposition,
	precipitationSpeciesOf,
	type CompositionWarning,
	type PrecipitationSpecies
} from './composition';

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
const LIMIT_MARGIN = 2e-3;
/** g/L on the lines: 4 significant figures, rounded up so every need stays met. */
const LINE_FIGURES = 4;
/**
 * A tie-break cost per mg: what neither side of a pair carries (glucose, ammonium, amino acids) goes with the
 * phosphate, so the Ca/Mg/Fe feed stays a small salt feed; it moves over only when the limits need the room.
 */
const NEUTRAL_IN_CATION_FEED_COST = 1e-4;

type Side = 'cation' | 'anion' | 'both' | 'neutral';

interface Prepared {
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

interface Slot {
	key: DesignedFeed['key'];
	members: number[];
}

/** Solubility always binds; the osmolality and solids limits can be left out to find which one fails. */
interface Limits {
	osmolality: number | null;
	solids: number | null;
}

type Volume = { fixedL: number } | { maxL: number | null };

interface LpSolution {
	/** [slot][candidate] in mg. */
	massMg: number[][];
	volumeL: number[];
}

const CATION_SPECIES = new Set<string>(PRECIPITATION_RULES.map((r) => r.cation));
const ANION_SPECIES = new Set<string>(PRECIPITATION_RULES.map((r) => r.anion));

function round3(value: number): string {
	return Number(value.toPrecision(3)).toString();
}

function ceilFigures(value: number, figures: number): number {
	if (value <= 0) return 0;
	const step = 10 ** (Math.floor(Math.log10(value)) - figures + 1);
	return Number((Math.ceil(value / step - 1e-9) * step).toPrecision(figures));
}

function listWords(words: string[], joiner = 'and'): string {
	if (words.length <= 1) return words.join('');
	return `${words.slice(0, -1).join(', ')} ${joiner} ${words[words.length - 1]}`;
}

function finite(
	value: unknown,
	field: string,
	what: string,
	{ min, max, strict }: { min: number; max?: number; strict?: boolean }
): number {
	const ok =
		typeof value === 'number' &&
		Number.isFinite(value) &&
		(strict ? value > min : value >= min) &&
		(max === undefined || value <= max);
	if (!ok) {
		const range =
			max === undefined
				? `${strict ? 'greater than' : 'at least'} ${min}`
				: `from ${min} to ${max}`;
		throw new ChemistryInputError(`${what} must be a number ${range}`, { field });
	}
	return value as number;
}

function prepare(candidate: FeedCandidate, index: number, temperatureC: number): Prepared {
	const field = `candidates.${index}`;
	if (!candidate || typeof candidate !== 'object')
		throw new ChemistryInputError('Candidate is missing', { field });
	const resolved = resolveComponent(candidate.component, `${field}.component`);
	const content = new Map<string, number>([[resolved.spec.id, 1]]);
	resolved.elementSymbols.forEach((symbol, i) => {
		if (resolved.elementGPerG[i] > 0) content.set(symbol, resolved.elementGPerG[i]);
	});
	const basis = candidate.basis;
	if (basis && resolved.molarMassGPerMol !== null) {
		finite(
			basis.molarMassGPerMol,
			`${field}.basis.molarMassGPerMol`,
			'Molar mass of the basis form',
			{ min: 0, strict: true }
		);
		content.set(basis.id, basis.molarMassGPerMol / resolved.molarMassGPerMol);
	}
	let solubilityGPerL: number | null = null;
	if (resolved.solubility) {
		const limit = solubilityAt(resolved.solubility.points, temperatureC).gPerL;
		const { basisMolarMassGPerMol } = resolved.solubility;
		// The library states it for the basis form; computeComposition compares on that basis too.
		solubilityGPerL =
			basisMolarMassGPerMol !== null && resolved.molarMassGPerMol !== null
				? (limit / basisMolarMassGPerMol) * resolved.molarMassGPerMol
				: limit;
	}
	const counted = resolved.molarMassGPerMol !== null && resolved.particlesPerUnit !== null;
	const species = new Set(
		counted ? precipitationSpeciesOf(resolved.ions).map((s) => s.species) : []
	);
	const cation = [...species].some((s) => CATION_SPECIES.has(s));
	const anion = [...species].some((s) => ANION_SPECIES.has(s));
	return {
		index,
		spec: resolved.spec,
		content,
		solubilityGPerL,
		osmolalityPerGPerL: counted
			? (1000 * resolved.particlesPerUnit! * resolved.osmoticCoefficient) /
				resolved.molarMassGPerMol!
			: 0,
		hasMolarMass: resolved.molarMassGPerMol !== null,
		species,
		side: cation && anion ? 'both' : cation ? 'cation' : anion ? 'anion' : 'neutral'
	};
}

function checkInput(input: FeedDesignInput) {
	if (!input || typeof input !== 'object')
		throw new ChemistryInputError('The design input is missing', { field: '(input)' });
	if (!Array.isArray(input.candidates) || input.candidates.length === 0) {
		throw new ChemistryInputError('Choose at least one component for the feed', {
			field: 'candidates'
		});
	}
	if (!Array.isArray(input.needs))
		throw new ChemistryInputError('Needs must be a list', { field: 'needs' });
	input.needs.forEach((n, i) => {
		if (!n || typeof n.key !== 'string' || !n.key)
			throw new ChemistryInputError('A need names its nutrient', { field: `needs.${i}.key` });
		finite(n.requiredGPerLFinal, `needs.${i}.requiredGPerLFinal`, `Requirement of ${n.key}`, {
			min: 0
		});
		finite(n.presentG, `needs.${i}.presentG`, `Basal supply of ${n.key}`, { min: 0 });
	});
	finite(input.initialVolumeL, 'initialVolumeL', 'Initial volume (L)', { min: 0, strict: true });
	finite(input.maxFeedVolumeL, 'maxFeedVolumeL', 'Room left for feed (L)', { min: 0 });
	finite(input.feedVolumeL, 'feedVolumeL', 'Feed volume (L)', { min: 0, strict: true });
	if (input.feedVolumeL > input.maxFeedVolumeL * (1 + 1e-12)) {
		throw new ChemistryInputError(
			`Feed volume (L) must be at most the ${round3(input.maxFeedVolumeL)} L left in the vessel`,
			{ field: 'feedVolumeL' }
		);
	}
	finite(input.temperatureC, 'temperatureC', 'Feed temperature (°C)', { min: -10, max: 100 });
	finite(input.osmolalityMaxMOsmPerKg, 'osmolalityMaxMOsmPerKg', 'Osmolality limit (mOsm/kg)', {
		min: 0,
		strict: true
	});
	finite(input.dissolvedSolidsMaxGPerL, 'dissolvedSolidsMaxGPerL', 'Dissolved-solids limit (g/L)', {
		min: 0,
		strict: true
	});
}

class Design {
	readonly prepared: Prepared[];
	readonly needs: FeedNeed[];

	constructor(readonly input: FeedDesignInput) {
		checkInput(input);
		const seen = new Map<string, number>();
		this.prepared = input.candidates.map((c, i) => {
			const p = prepare(c, i, input.temperatureC);
			const earlier = seen.get(p.spec.id);
			if (earlier !== undefined)
				throw new ChemistryInputError(`${p.spec.name} is already candidate ${earlier + 1}`, {
					field: `candidates.${i}`
				});
			seen.set(p.spec.id, i);
			return p;
		});
		this.needs = input.needs.filter((n) => n.requiredGPerLFinal > 0);
	}

	neededGAt(need: FeedNeed, feedVolumeL: number): number {
		return need.requiredGPerLFinal * (this.input.initialVolumeL + feedVolumeL) - need.presentG;
	}

	limits(kind: 'solubility' | 'osmolality' | 'all'): Limits {
		return {
			osmolality: kind === 'solubility' ? null : this.input.osmolalityMaxMOsmPerKg,
			solids: kind === 'all' ? this.input.dissolvedSolidsMaxGPerL : null
		};
	}

	/** The linear program over the slots' masses (mg) and volumes (L). */
	solve(
		slots: Slot[],
		volume: Volume,
		limits: Limits,
		objective: 'mass' | 'osmoles' | 'solids' | 'volume' | 'maxVolume'
	): LpSolution | null {
		const keep = 1 - LIMIT_MARGIN;
		const constraints: Record<string, { min?: number; max?: number; equal?: number }> = {};
		const variables: Record<string, Record<string, number>> = {};
		const fixed = 'fixedL' in volume;
		this.needs.forEach((need, i) => {
			if (fixed) {
				const neededG = this.neededGAt(need, volume.fixedL);
				if (neededG > 0) constraints[`need${i}`] = { min: neededG * 1000 };
			} else constraints[`need${i}`] = { min: this.neededGAt(need, 0) * 1000 };
		});
		if (fixed) constraints.volume = { equal: volume.fixedL };
		else if (volume.maxL !== null) constraints.volume = { max: volume.maxL };
		slots.forEach((slot, s) => {
			const v: Record<string, number> = {
				volume: 1,
				cost: objective === 'volume' ? 1 : objective === 'maxVolume' ? -1 : 0
			};
			if (!fixed)
				this.needs.forEach((need, i) => (v[`need${i}`] = -need.requiredGPerLFinal * 1000));
			if (limits.osmolality !== null) {
				constraints[`osm${s}`] = { max: 0 };
				v[`osm${s}`] = -limits.osmolality * keep * 1000;
			}
			if (limits.solids !== null) {
				constraints[`solids${s}`] = { max: 0 };
				v[`solids${s}`] = -limits.solids * keep * 1000;
			}
			for (const j of slot.members) {
				const p = this.prepared[j];
				const m: Record<string, number> = {};
				if (objective === 'mass')
					m.cost =
						1 + (slot.key === 'cations' && p.side === 'neutral' ? NEUTRAL_IN_CATION_FEED_COST : 0);
				else if (objective === 'osmoles') m.cost = p.osmolalityPerGPerL;
				else if (objective === 'solids') m.cost = 1;
				// A whisper of mass cost keeps the masses from wandering when only the volume counts.
				else m.cost = 1e-9;
				this.needs.forEach((need, i) => {
					const a = p.content.get(need.key);
					if (a) m[`need${i}`] = a;
				});
				if (p.solubilityGPerL !== null) {
					constraints[`sol${s}_${j}`] = { max: 0 };
					m[`sol${s}_${j}`] = 1;
					v[`sol${s}_${j}`] = -p.solubilityGPerL * keep * 1000;
				}
				if (limits.osmolality !== null) m[`osm${s}`] = p.osmolalityPerGPerL;
				if (limits.solids !== null) m[`solids${s}`] = 1;
				variables[`m${s}_${j}`] = m;
			}
			variables[`v${s}`] = v;
		});
		const result = solver.Solve({ optimize: 'cost', opType: 'min', constraints, variables }) as {
			feasible: boolean;
			bounded?: boolean;
			[k: string]: number | boolean | undefined;
		};
		if (!result.feasible || result.bounded === false) return null;
		const value = (name: string) => Math.max(0, Number(result[name] ?? 0));
		return {
			massMg: slots.map((slot, s) =>
				this.prepared.map((_, j) => (slot.members.includes(j) ? value(`m${s}_${j}`) : 0))
			),
			volumeL: slots.map((_, s) => value(`v${s}`))
		};
	}
}

/**
 * The smallest volume each feed needs for its masses under every limit; the total is then shared in
 * proportion, so each feed sits equally far below its tightest limit.
 */
function shareVolume(
	design: Design,
	massMg: number[][],
	totalL: number,
	fallbackL: number[]
): number[] {
	const keep = 1 - LIMIT_MARGIN;
	const { osmolalityMaxMOsmPerKg: osmMax, dissolvedSolidsMaxGPerL: solidsMax } = design.input;
	const smallest = massMg.map((masses) => {
		let volume = 0;
		let osmoles = 0;
		let solids = 0;
		masses.forEach((mg, j) => {
			const p = design.prepared[j];
			const g = mg / 1000;
			osmoles += g * p.osmolalityPerGPerL;
			solids += g;
			if (p.solubilityGPerL !== null) volume = Math.max(volume, g / (p.solubilityGPerL * keep));
		});
		return Math.max(volume, osmoles / (osmMax * keep), solids / (solidsMax * keep));
	});
	const sum = smallest.reduce((a, b) => a + b, 0);
	if (!(sum > 0) || sum > totalL * (1 + 1e-9)) return fallbackL;
	return smallest.map((v) => (v / sum) * totalL);
}

function buildFeed(
	design: Design,
	slot: Slot,
	masses: number[],
	volumeL: number,
	split: boolean
): DesignedFeed {
	const lines: DesignedFeedLine[] = [];
	masses.forEach((mg, j) => {
		const gPerL = ceilFigures(mg / 1000 / volumeL, LINE_FIGURES);
		if (!(gPerL > 0)) return;
		const p = design.prepared[j];
		lines.push({
			componentId: p.spec.id,
			name: p.spec.name,
			gPerL,
			massG: gPerL * volumeL,
			solubilityGPerL: p.solubilityGPerL,
			atSolubilityLimit: p.solubilityGPerL !== null && gPerL >= p.solubilityGPerL * 0.99
		});
	});
	const composition = computeComposition({
		lines: lines.map((l) => ({
			component: design.prepared.find((p) => p.spec.id === l.componentId)!.spec,
			amount: l.gPerL,
			unit: 'g/L'
		})),
		temperatureC: design.input.temperatureC
	});
	const held = lines.map((l) => design.prepared.find((p) => p.spec.id === l.componentId)!);
	const carried = new Set(held.flatMap((p) => [...p.species]));
	const cations = [...carried].filter((s) => CATION_SPECIES.has(s));
	const anions = [...carried].filter((s) => ANION_SPECIES.has(s));
	const others = held.some((p) => p.side === 'neutral');
	let label = 'Feed';
	let description = 'One feed concentrate carrying every chosen component the culture needs.';
	if (split && slot.key === 'cations') {
		label = 'Feed A';
		description = `Carries ${listWords(cations)}${others ? ', with some of the other components to stay within the limits' : ''}; no ${listWords([...ANION_SPECIES], 'or')}. Commonly kept slightly acidic so the metal salts stay dissolved (common practice; pH is not modelled here). Feed it through its own line.`;
	} else if (split) {
		label = 'Feed B';
		description = `Carries ${anions.length ? listWords(anions) : 'the components that need not be kept apart'}${anions.length && others ? ' and the components that need not be kept apart' : ''}; no ${listWords([...CATION_SPECIES], 'or')}. Feed it through its own line, not mixed with feed A before it reaches the culture.`;
	}
	return {
		key: slot.key,
		label,
		description,
		volumeL,
		lines,
		osmolalityMOsmPerKg: composition.osmolality.estimateMOsmPerKg,
		dissolvedSolidsGPerL: composition.dissolvedSolidsGPerL,
		warnings: composition.warnings.map((w) => ({
			kind: w.kind,
			basis: w.basis,
			message: w.message,
			precipitate: w.precipitate
		}))
	};
}

function adviceFor(nutrientName: string, componentName: string): string {
	if (/tyrosine|cystine/i.test(componentName))
		return 'use a soluble salt form or a separate alkaline feed';
	return `use a more soluble form of ${nutrientName}, a larger feed volume, or a separate feed`;
}

/** Why the slots cannot meet every need at the requested volume, one sentence each. */
function explain(
	design: Design,
	slots: Slot[]
): { problems: string[]; minimumFeedVolumeL: number | null } {
	const { feedVolumeL, temperatureC, osmolalityMaxMOsmPerKg, dissolvedSolidsMaxGPerL } =
		design.input;
	const problems: string[] = [];
	const fixed = { fixedL: feedVolumeL };
	const usable = new Set(slots.flatMap((s) => s.members));
	for (const need of design.needs) {
		const neededG = design.neededGAt(need, feedVolumeL);
		if (neededG <= 0) continue;
		const carriers = design.prepared.filter((p) => usable.has(p.index) && p.content.get(need.key));
		if (carriers.length === 0 || carriers.some((c) => c.solubilityGPerL === null)) continue;
		const reachableGPerL = carriers.reduce(
			(sum, c) => sum + c.content.get(need.key)! * c.solubilityGPerL!,
			0
		);
		const neededGPerL = neededG / feedVolumeL;
		if (reachableGPerL * (1 - LIMIT_MARGIN) >= neededGPerL) continue;
		const main = carriers.reduce((best, c) =>
			c.content.get(need.key)! * c.solubilityGPerL! >
			best.content.get(need.key)! * best.solubilityGPerL!
				? c
				: best
		);
		problems.push(
			`${main.spec.name} would need ${round3(neededGPerL / main.content.get(need.key)!)} g/L, above its solubility of ${round3(main.solubilityGPerL!)} g/L at ${temperatureC} °C; ${adviceFor(need.name, main.spec.name)}.`
		);
	}
	if (problems.length === 0) {
		if (!design.solve(slots, fixed, design.limits('solubility'), 'mass')) {
			problems.push(
				'No combination of the chosen components meets every demand within their solubilities together.'
			);
		} else if (!design.solve(slots, fixed, design.limits('osmolality'), 'mass')) {
			const least = design.solve(slots, fixed, design.limits('solubility'), 'osmoles');
			const osmoles = least
				? least.massMg.reduce(
						(sum, masses) =>
							sum +
							masses.reduce(
								(s, mg, j) => s + (mg / 1000) * design.prepared[j].osmolalityPerGPerL,
								0
							),
						0
					)
				: null;
			problems.push(
				`Within the osmolality limit of ${round3(osmolalityMaxMOsmPerKg)} mOsm/kg the demands do not fit: in ${round3(feedVolumeL)} L the chosen components come to at least ${osmoles === null ? 'more than that' : `${round3(osmoles / feedVolumeL)} mOsm/kg`} (the recipe analysis's estimate).`
			);
		} else {
			const least = design.solve(slots, fixed, design.limits('osmolality'), 'solids');
			const solidsG = least
				? least.massMg.reduce((sum, masses) => sum + masses.reduce((s, mg) => s + mg / 1000, 0), 0)
				: null;
			problems.push(
				`Within the dissolved-solids limit of ${round3(dissolvedSolidsMaxGPerL)} g/L the demands do not fit: in ${round3(feedVolumeL)} L the chosen components come to at least ${solidsG === null ? 'more than that' : `${round3(solidsG / feedVolumeL)} g/L`}.`
			);
		}
	}
	const volume = explainVolume(design, slots);
	return {
		problems: [...problems, ...volume.problems],
		minimumFeedVolumeL: volume.minimumFeedVolumeL
	};
}

/** The feed volume, in all, that these components and limits would take; a sentence saying so. */
function explainVolume(
	design: Design,
	slots: Slot[]
): { problems: string[]; minimumFeedVolumeL: number | null } {
	const { feedVolumeL, maxFeedVolumeL } = design.input;
	const all = design.limits('all');
	const total = (solution: LpSolution) => solution.volumeL.reduce((a, b) => a + b, 0);
	const feeds = slots.length > 1 ? 'two feeds of' : 'a feed of';
	const smallest = design.solve(slots, { maxL: maxFeedVolumeL }, all, 'volume');
	if (smallest) {
		const minimumL = total(smallest);
		if (minimumL > feedVolumeL) {
			return {
				problems: [
					`With these components and limits, ${feeds} at least ${round3(minimumL)} L in all would work (the vessel has room for ${round3(maxFeedVolumeL)} L); or raise a limit, or choose more soluble components.`
				],
				minimumFeedVolumeL: minimumL
			};
		}
		const largest = design.solve(slots, { maxL: maxFeedVolumeL }, all, 'maxVolume');
		return {
			problems: [
				`More feed dilutes the culture faster than these components can make up within the limits: ${feeds} ${round3(minimumL)} to ${round3(largest ? total(largest) : minimumL)} L in all would work.`
			],
			minimumFeedVolumeL: minimumL
		};
	}
	const unbounded = design.solve(slots, { maxL: null }, all, 'volume');
	if (unbounded) {
		return {
			problems: [
				`It would take ${feeds} at least ${round3(total(unbounded))} L in all, more than the ${round3(maxFeedVolumeL)} L left in the vessel; raise a limit or choose more soluble components.`
			],
			minimumFeedVolumeL: null
		};
	}
	return {
		problems: [
			'No feed volume is enough: each litre of feed adds more demand (it dilutes the culture) than it can carry within the limits.'
		],
		minimumFeedVolumeL: null
	};
}

function coverageOf(design: Design, feeds: DesignedFeed[]): FeedCoverage[] {
	const byId = new Map(design.prepared.map((p) => [p.spec.id, p]));
	return design.input.needs.map((need) => {
		const neededG = Math.max(0, design.neededGAt(need, design.input.feedVolumeL));
		const providedG = feeds.reduce(
			(sum, f) =>
				sum +
				f.lines.reduce(
					(s, l) => s + (byId.get(l.componentId)!.content.get(need.key) ?? 0) * l.massG,
					0
				),
			0
		);
		return { key: need.key, name: need.name, neededG, providedG, coveredByBasal: neededG === 0 };
	});
}

/** Problems the recipe analysis finds in a proposed feed: none is expected, each is reported. */
function verify(design: Design, feeds: DesignedFeed[], coverage: FeedCoverage[]): string[] {
	const problems: string[] = [];
	for (const feed of feeds) {
		for (const w of feed.warnings) problems.push(`${feed.label}: ${w.message}`);
		if (feed.osmolalityMOsmPerKg > design.input.osmolalityMaxMOsmPerKg) {
			problems.push(
				`${feed.label}: ${round3(feed.osmolalityMOsmPerKg)} mOsm/kg is above the limit of ${round3(design.input.osmolalityMaxMOsmPerKg)} mOsm/kg.`
			);
		}
		if (feed.dissolvedSolidsGPerL > design.input.dissolvedSolidsMaxGPerL) {
			problems.push(
				`${feed.label}: ${round3(feed.dissolvedSolidsGPerL)} g/L dissolved is above the limit of ${round3(design.input.dissolvedSolidsMaxGPerL)} g/L.`
			);
		}
	}
	for (const c of coverage) {
		if (c.providedG < c.neededG * (1 - 1e-6))
			problems.push(
				`${c.name}: the feeds bring ${round3(c.providedG)} g of the ${round3(c.neededG)} g needed.`
			);
	}
	return problems;
}

/**
 * Proposes one feed concentrate, or two when the recipe analysis would flag a precipitation pair in
 * one, that with the basal medium covers every need; or says, one sentence per reason, why none can.
 */
export function designFeeds(input: FeedDesignInput): FeedDesignResult {
	const design = new Design(input);
	const { feedVolumeL } = input;
	const base = {
		feedVolumeL,
		maxFeedVolumeL: input.maxFeedVolumeL,
		temperatureC: input.temperatureC,
		osmolalityMaxMOsmPerKg: input.osmolalityMaxMOsmPerKg,
		dissolvedSolidsMaxGPerL: input.dissolvedSolidsMaxGPerL
	};
	const notes: string[] = [];
	for (const p of design.prepared) {
		if (p.solubilityGPerL === null)
			notes.push(
				`${p.spec.name}: no solubility data in the library, so it is not limited here; check it dissolves.`
			);
		if (!p.hasMolarMass)
			notes.push(
				`${p.spec.name}: no molar mass, so it is left out of the osmolality estimate, as in the recipe analysis.`
			);
	}
	const finish = (
		result: Partial<FeedDesignResult> & Pick<FeedDesignResult, 'feeds' | 'problems'>
	): FeedDesignResult => {
		const coverage = coverageOf(design, result.feeds);
		const problems = result.problems.length
			? result.problems
			: verify(design, result.feeds, coverage);
		const used = new Set(result.feeds.flatMap((f) => f.lines.map((l) => l.componentId)));
		const unused = design.prepared.filter((p) => !used.has(p.spec.id)).map((p) => p.spec.name);
		if (problems.length === 0 && result.feeds.length && unused.length)
			notes.push(`Not needed in the proposal: ${listWords(unused)}.`);
		return {
			...base,
			split: null,
			minimumFeedVolumeL: null,
			notes,
			...result,
			coverage,
			problems,
			feasible: problems.length === 0
		};
	};

	if (design.needs.every((n) => design.neededGAt(n, feedVolumeL) <= 0)) {
		notes.push(
			'The basal medium already covers every nutrient at the target with the safety factor: no feed is needed.'
		);
		return finish({ feeds: [], problems: [], minimumFeedVolumeL: 0 });
	}
	const missing = design.needs
		.filter(
			(n) =>
				design.neededGAt(n, feedVolumeL) > 0 && !design.prepared.some((p) => p.content.get(n.key))
		)
		.map(
			(n) =>
				`No chosen component provides ${n.name}; the feed needs ${round3(design.neededGAt(n, feedVolumeL))} g of it in all. Add a component that carries it.`
		);
	if (missing.length) return finish({ feeds: [], problems: missing });

	const single: Slot = { key: 'single', members: design.prepared.map((p) => p.index) };
	const one = design.solve([single], { fixedL: feedVolumeL }, design.limits('all'), 'mass');
	if (!one) {
		const explained = explain(design, [single]);
		// A single feed of the volume that fits may still precipitate: then the volume to name is the split's.
		const atLeast = explained.minimumFeedVolumeL;
		const there =
			atLeast === null
				? null
				: design.solve([single], { fixedL: atLeast }, design.limits('all'), 'mass');
		const precipitates = there
			? buildFeed(design, single, there.massMg[0], atLeast!, false).warnings.flatMap((w) =>
					w.precipitate ? [w.precipitate] : []
				)
			: [];
		if (precipitates.length) {
			const volume = explainVolume(design, splitSlots(design));
			explained.problems.splice(
				-1,
				1,
				`A single feed that fits would be flagged for ${listWords(precipitates)} by the recipe analysis, so it would be split in two. ${volume.problems[0]}`
			);
			explained.minimumFeedVolumeL = volume.minimumFeedVolumeL;
		}
		return finish({
			feeds: [],
			problems: explained.problems,
			minimumFeedVolumeL: explained.minimumFeedVolumeL
		});
	}
	const singleFeed = buildFeed(design, single, one.massMg[0], feedVolumeL, false);
	const flagged = singleFeed.warnings.filter((w) => w.kind === 'precipitation');
	if (flagged.length === 0) return finish({ feeds: [singleFeed], problems: [] });

	// One feed would precipitate: the rules' cations go in one feed, their anions in the other.
	const flaggedRules = PRECIPITATION_RULES.filter((rule) =>
		flagged.some((w) => w.precipitate === rule.product)
	);
	const split = {
		precipitates: flaggedRules.map((r) => r.product),
		warnings: flagged.map((w) => w.message)
	};
	const usedInOne = new Set(one.massMg[0].flatMap((mg, j) => (mg > 0 ? [j] : [])));
	const selfConflicting = design.prepared.filter(
		(p) =>
			usedInOne.has(p.index) &&
			flaggedRules.some((r) => p.species.has(r.cation) && p.species.has(r.anion))
	);
	if (selfConflicting.length) {
		const problems = selfConflicting.map((p) => {
			const rule = flaggedRules.find((r) => p.species.has(r.cation) && p.species.has(r.anion))!;
			return `${p.spec.name} brings both ${rule.cation} and ${rule.anion} itself, so no split keeps that pair apart: at the amount this feed needs the recipe analysis flags ${rule.product} in any feed that holds it. Choose a source of ${rule.cation} without ${rule.anion}, or of ${rule.anion} without ${rule.cation}.`;
		});
		return finish({ feeds: [], problems, split });
	}
	for (const p of design.prepared.filter((c) => c.side === 'both')) {
		notes.push(
			`${p.spec.name} carries both a cation and an anion of the precipitation rules, so it is left out of the split feeds.`
		);
	}
	const slots = splitSlots(design);
	const two = design.solve(slots, { fixedL: feedVolumeL }, design.limits('all'), 'mass');
	const why = `One feed is ruled out: the recipe analysis flags ${listWords(split.precipitates)} in it (common practice: these are kept apart).`;
	if (!two) {
		const explained = explain(design, slots);
		return finish({
			feeds: [],
			split,
			problems: [
				`${why} Split in two, the feeds cannot meet every demand within the limits:`,
				...explained.problems
			],
			minimumFeedVolumeL: explained.minimumFeedVolumeL
		});
	}
	const volumes = shareVolume(design, two.massMg, feedVolumeL, two.volumeL);
	const feeds = slots
		.map((slot, s) => ({ slot, s }))
		.filter(({ s }) => two.massMg[s].some((mg) => mg > 0))
		.map(({ slot, s }) => buildFeed(design, slot, two.massMg[s], volumes[s], true));
	return finish({ feeds, problems: [], split });
}

/** The Ca/Mg/Fe salts in one feed, phosphate and carbonate in the other; the rest may go in either. */
function splitSlots(design: Design): Slot[] {
	const on = (...sides: Side[]) =>
		design.prepared.filter((p) => sides.includes(p.side)).map((p) => p.index);
	return [
		{ key: 'cations', members: on('cation', 'neutral') },
		{ key: 'anions', members: on('anion', 'neutral') }
	];
}
