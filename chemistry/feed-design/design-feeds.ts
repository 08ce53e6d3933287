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
import { PRECIPITATION_RULES, computeComposition } from '../composition';
import {
	type FeedDesignInput,
	type DesignedFeedLine,
	type DesignedFeed,
	type FeedDesignResult,
	LIMIT_MARGIN,
	LINE_FIGURES,
	type Side,
	type Slot
} from './types';
import { CATION_SPECIES, ANION_SPECIES, round3, ceilFigures, listWords } from './prepare';
import { Design } from './design';
import { explain, explainVolume, coverageOf, verify } from './explain';
export {
	type FeedCandidate,
	type FeedNeed,
	type FeedLimits,
	type FeedDesignInput,
	type FeedLimitBasis,
	FEED_LIMIT_DEFAULTS,
	type DesignedFeedLine,
	type DesignedFeed,
	type FeedCoverage,
	type FeedDesignResult
} from './types';

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
	if (!one) return finish({ feeds: [], ...explainSingleFeedFailure(design, single) });
	const singleFeed = buildFeed(design, single, one.massMg[0], feedVolumeL, false);
	const flagged = singleFeed.warnings.filter((w) => w.kind === 'precipitation');
	if (flagged.length === 0) return finish({ feeds: [singleFeed], problems: [] });

	return finish(designSplitFeeds(design, one.massMg[0], flagged, feedVolumeL, notes));
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

/** Why no single feed fits; a single feed of the volume that fits may still precipitate, then the split's volume is named. */
function explainSingleFeedFailure(
	design: Design,
	single: Slot
): { problems: string[]; minimumFeedVolumeL: number | null } {
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
	return { problems: explained.problems, minimumFeedVolumeL: explained.minimumFeedVolumeL };
}

/** One feed would precipitate: the rules' cations go in one feed, their anions in the other. */
function designSplitFeeds(
	design: Design,
	singleMassMg: number[],
	flagged: DesignedFeed['warnings'],
	feedVolumeL: number,
	notes: string[]
): Pick<FeedDesignResult, 'feeds' | 'problems'> & Partial<FeedDesignResult> {
	const flaggedRules = PRECIPITATION_RULES.filter((rule) =>
		flagged.some((w) => w.precipitate === rule.product)
	);
	const split = {
		precipitates: flaggedRules.map((r) => r.product),
		warnings: flagged.map((w) => w.message)
	};
	const usedInOne = new Set(singleMassMg.flatMap((mg, j) => (mg > 0 ? [j] : [])));
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
		return { feeds: [], problems, split };
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
		return {
			feeds: [],
			split,
			problems: [
				`${why} Split in two, the feeds cannot meet every demand within the limits:`,
				...explained.problems
			],
			minimumFeedVolumeL: explained.minimumFeedVolumeL
		};
	}
	const volumes = shareVolume(design, two.massMg, feedVolumeL, two.volumeL);
	const feeds = slots
		.map((slot, s) => ({ slot, s }))
		.filter(({ s }) => two.massMg[s].some((mg) => mg > 0))
		.map(({ slot, s }) => buildFeed(design, slot, two.massMg[s], volumes[s], true));
	return { feeds, problems: [], split };
}
