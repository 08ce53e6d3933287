import type { SufficiencyLine } from '../sufficiency';
import type { StudyFeedSource, StudySource } from './types';
import type { PlanCourse } from './time-course';

export interface RunoutInput {
	lines: SufficiencyLine[];
	targetBiomassGPerL: number;
	basal: StudySource;
	initialVolumeL: number;
	feeds: StudyFeedSource[];
	/** Volume each feed can deliver at most (a controlled feed's bottle), L, aligned with `feeds`. */
	availableL: number[];
	course: PlanCourse;
}

export interface Runout {
	/** When the culture has first taken all that was supplied by then. */
	shortFromH: number;
	/** When later feeding covers it again; null when it stays short to the end. */
	coveredAgainH: number | null;
}

/**
 * When each nutrient runs out along the simulated run. Every requirement line is linear in biomass
 * (g per g dry biomass, or per cell at a fixed cell mass), so by time t the culture has taken
 * r·X(t)·V(t) with r = demand / target biomass, as the sufficiency table counts it; the supply by
 * then is the basal amount plus each feed's concentration times the volume it has delivered. The
 * first time the first exceeds the second (linearly interpolated between output points) is when it
 * runs short; a feed may cover it again later. Null when it never runs short.
 */
export function findRunoutTimes(input: RunoutInput): (Runout | null)[] {
	const { course } = input;
	const { t, biomassGPerL, volumeL } = course;
	return input.lines.map((line) => {
		const perGBiomass = line.demandGPerL / input.targetBiomassGPerL;
		const conc = (source: StudySource) =>
			(line.basis === 'element'
				? source.composition.elementsGPerL
				: source.composition.componentsGPerL)[line.key] ?? 0;
		const basalG = conc(input.basal) * input.initialVolumeL;
		const feedConc = input.feeds.map(conc);
		const deficit = (i: number) => {
			let supply = basalG;
			input.feeds.forEach(
				(_, k) =>
					(supply +=
						feedConc[k] * Math.min(course.deliveries[k].cumulativeL[i], input.availableL[k]))
			);
			return perGBiomass * biomassGPerL[i] * volumeL[i] - supply;
		};
		let shortFromH: number | null = null;
		let coveredAgainH: number | null = null;
		let previous = deficit(0);
		if (previous > 0) shortFromH = t[0];
		for (let i = 1; i < t.length; i++) {
			const current = deficit(i);
			if (current > 0 && previous <= 0) {
				shortFromH ??= zeroCrossingH(t, i, previous, current);
				coveredAgainH = null;
			} else if (current <= 0 && previous > 0)
				coveredAgainH = zeroCrossingH(t, i, previous, current);
			previous = current;
		}
		return shortFromH === null ? null : { shortFromH, coveredAgainH };
	});
}

/** When a feed with a limited volume has delivered all of it; null when it never empties. */
export function findEmptyTime(
	t: number[],
	cumulativeL: number[],
	availableL: number
): number | null {
	for (let i = 1; i < t.length; i++) {
		if (cumulativeL[i] > availableL)
			return zeroCrossingH(t, i, cumulativeL[i - 1] - availableL, cumulativeL[i] - availableL);
	}
	return null;
}

/** Where a quantity of `before` at t[i − 1] and `after` at t[i] passes 0, linearly interpolated. */
function zeroCrossingH(t: number[], i: number, before: number, after: number): number {
	return t[i - 1] + ((t[i] - t[i - 1]) * -before) / (after - before);
}
