// Why a design is infeasible, and whether the proposed feeds cover every need.
import {
	type DesignedFeed,
	type FeedCoverage,
	LIMIT_MARGIN,
	type Slot,
	type LpSolution
} from './types';
import { round3 } from './prepare';
import { Design } from './design';

function adviceFor(nutrientName: string, componentName: string): string {
	if (/tyrosine|cystine/i.test(componentName))
		return 'use a soluble salt form or a separate alkaline feed';
	return `use a more soluble form of ${nutrientName}, a larger feed volume, or a separate feed`;
}

/** Why the slots cannot meet every need at the requested volume, one sentence each. */
export function explain(
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
export function explainVolume(
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

export function coverageOf(design: Design, feeds: DesignedFeed[]): FeedCoverage[] {
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
export function verify(design: Design, feeds: DesignedFeed[], coverage: FeedCoverage[]): string[] {
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
