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
 * The dry biomass each line's supply allows by each output time, g: every requirement line is linear
 * in biomass (g per g dry biomass, or per cell at a fixed cell mass), r = demand / target biomass, as
 * the sufficiency table counts it (without the safety factor); the supply by then is the basal amount
 * plus each feed's concentration times the volume it has delivered, so the culture can hold at most
 * supply / r grams of biomass. Infinity for a line without demand.
 */
export function findBiomassAllowedG(input: RunoutInput): number[][] {
	const { course } = input;
	return input.lines.map((line) => {
		const perGBiomass = line.demandGPerL / input.targetBiomassGPerL;
		if (!(perGBiomass > 0)) return course.t.map(() => Infinity);
		const conc = (source: StudySource) =>
			(line.basis === 'element'
				? source.composition.elementsGPerL
				: source.composition.componentsGPerL)[line.key] ?? 0;
		const basalG = conc(input.basal) * input.initialVolumeL;
		const feedConc = input.feeds.map(conc);
		return course.t.map((_, i) => {
			let supplyG = basalG;
			input.feeds.forEach(
				(_, k) =>
					(supplyG +=
						feedConc[k] * Math.min(course.deliveries[k].cumulativeL[i], input.availableL[k]))
			);
			return supplyG / perGBiomass;
		});
	});
}

/**
 * When each nutrient runs out along the simulated run: the first time the culture's biomass X·V
 * reaches what the nutrient supplied by then allows (`findBiomassAllowedG`), linearly interpolated
 * between output points; a feed may cover it again later. Null when it never runs short.
 *
 * `heldToG`, when given, is the most biomass the required nutrients allow at each time (see
 * `holdToNutrients`): the culture never grows past it, so a line runs short only where that
 * limit, too, has reached what the line allows.
 */
export function findRunoutTimes(
	input: RunoutInput,
	heldToG: number[] | null = null
): (Runout | null)[] {
	const { t, biomassGPerL, volumeL } = input.course;
	const massG = t.map((_, i) => biomassGPerL[i] * volumeL[i]);
	return findBiomassAllowedG(input).map((allowedG) => {
		if (allowedG.some((g) => !Number.isFinite(g))) return null;
		const conditions = [massG.map((m, i) => m - allowedG[i])];
		if (heldToG) conditions.push(heldToG.map((h, i) => h - allowedG[i]));
		return findStretch(t, conditions);
	});
}

/**
 * Where every condition series is ≥ 0: the first time they all are, and (when they stop being so
 * before the end) the time after the last such stretch. Each series is taken as linear between output
 * points, so all of them turn ≥ 0 at the latest of their own crossings, and one turning negative ends it.
 */
export function findStretch(t: number[], conditions: number[][]): Runout | null {
	const holds = (i: number) => conditions.every((c) => c[i] >= 0);
	let shortFromH: number | null = holds(0) ? t[0] : null;
	let coveredAgainH: number | null = null;
	let previous = holds(0);
	for (let i = 1; i < t.length; i++) {
		const current = holds(i);
		if (current && !previous) {
			shortFromH ??= Math.max(
				...conditions.map((c) => (c[i - 1] < 0 ? zeroCrossingH(t, i, c[i - 1], c[i]) : t[i - 1]))
			);
			coveredAgainH = null;
		} else if (!current && previous) {
			coveredAgainH = Math.min(
				...conditions.map((c) => (c[i] < 0 ? zeroCrossingH(t, i, c[i - 1], c[i]) : t[i]))
			);
		}
		previous = current;
	}
	return shortFromH === null ? null : { shortFromH, coveredAgainH };
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
