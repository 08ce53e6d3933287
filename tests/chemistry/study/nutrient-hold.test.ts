import { describe, expect, it } from 'vitest';
import {
	findRunoutTimes,
	findStretch,
	holdToNutrients,
	type PlanCourse,
	type SufficiencyLine
} from '$chemistry';

// Courses written by hand; a feed delivers 0.1 L/h. Demand at the 4 g/L target: N 0.56 g/L, so
// r_N = 0.14 g/g; P 0.12 g/L, so r_P = 0.03 g/g. A line allows supply / r grams of dry biomass
// (mass balance: every gram of biomass holds r grams of the nutrient), worked out by hand below.
const course = (biomassGPerL: number[], volumeL = [1, 1, 1, 1]) =>
	({
		t: [0, 1, 2, 3],
		biomassGPerL,
		volumeL,
		deliveries: [{ deliveredL: 0.3, cumulativeL: [0, 0.1, 0.2, 0.3] }]
	}) as unknown as PlanCourse;

const line = (key: string, demandGPerL: number, role: 'required' | 'trace' = 'required') =>
	({ key, basis: 'element', demandGPerL, role }) as SufficiencyLine;
const nitrogen = line('N', 0.56);
const phosphorus = line('P', 0.12);
const source = (elementsGPerL: Record<string, number>) => ({
	versionId: 'b',
	label: 'basal',
	temperatureC: 20,
	composition: { elementsGPerL, componentsGPerL: {} }
});
const feedOf = (elementsGPerL: Record<string, number>) => ({
	...source(elementsGPerL),
	label: 'feed',
	volumeL: 0.3,
	plan: {
		strategy: 'constant' as const,
		startH: 0,
		muSetPerH: null,
		setpointGPerL: null,
		doSetpointPercent: null,
		maxRateLPerH: null
	}
});
const inputOf = (
	lines: SufficiencyLine[],
	basal: Record<string, number>,
	biomass: PlanCourse,
	feed: Record<string, number> | null = null
) => ({
	lines,
	targetBiomassGPerL: 4,
	basal: source(basal),
	initialVolumeL: 1,
	feeds: feed ? [feedOf(feed)] : [],
	availableL: feed ? [0.3] : [],
	course: biomass
});

describe('the time course held to what the required nutrients supply (law of the minimum)', () => {
	it('basal 0.35 g/L N allows 0.35/0.14 = 2.5 g: X [1, 2, 3, 4] is held to [1, 2, 2.5, 2.5] from 1.5 h', () => {
		const hold = holdToNutrients(inputOf([nitrogen], { N: 0.35 }, course([1, 2, 3, 4])), [true]);
		[1, 2, 2.5, 2.5].forEach((x, i) => expect(hold.biomassGPerL[i]).toBeCloseTo(x, 12));
		// X·V − 2.5 is [−1.5, −0.5, 0.5, 1.5]: it passes 0 halfway between 1 h and 2 h.
		expect(hold.fromH).toBeCloseTo(1.5, 12);
		expect(hold.lineIndex).toBe(0);
	});

	it('a feed of 1 g/L N lifts the limit as it delivers: supply [0.2, 0.3, 0.4, 0.5] g allows [10, 15, 20, 25]/7 g', () => {
		const hold = holdToNutrients(
			inputOf([nitrogen], { N: 0.2 }, course([1, 3, 3.5, 4]), { N: 1 }),
			[true]
		);
		[1, 15 / 7, 20 / 7, 25 / 7].forEach((x, i) => expect(hold.biomassGPerL[i]).toBeCloseTo(x, 12));
		// X·V − allowed is [−3/7, 6/7, …]: it passes 0 at (3/7)/(9/7) = 1/3 h.
		expect(hold.fromH).toBeCloseTo(1 / 3, 12);
	});

	it('holds to the scarcer line, and a line marked not holding (a trace element) never does', () => {
		// N allows 2.5 g; P 0.09/0.03 = 3 g. N is the scarcer; with N not holding, P holds from X = 3 (2 h).
		const input = inputOf([phosphorus, nitrogen], { N: 0.35, P: 0.09 }, course([1, 2, 3, 4]));
		const both = holdToNutrients(input, [true, true]);
		expect(both.lineIndex).toBe(1);
		expect(both.biomassGPerL[3]).toBeCloseTo(2.5, 12);
		const phosphorusOnly = holdToNutrients(input, [true, false]);
		expect(phosphorusOnly.lineIndex).toBe(0);
		expect(phosphorusOnly.fromH).toBeCloseTo(2, 12);
		expect(phosphorusOnly.biomassGPerL[3]).toBeCloseTo(3, 12);
		expect(holdToNutrients(input, [false, false]).fromH).toBeNull();
	});

	it('never holds below the inoculum: basal 0.07 g/L N allows 0.5 g, yet the 1 g inoculum is there from the start', () => {
		const hold = holdToNutrients(inputOf([nitrogen], { N: 0.07 }, course([1, 2, 3, 4])), [true]);
		expect(hold.fromH).toBe(0);
		hold.biomassGPerL.forEach((x) => expect(x).toBeCloseTo(1, 12));
	});

	it('holds the mass, not the concentration: 2.5 g N-limited biomass in V [1, 1, 1.25, 1.25] L is 2 g/L at the end', () => {
		const hold = holdToNutrients(
			inputOf([nitrogen], { N: 0.35 }, course([1, 2, 3, 4], [1, 1, 1.25, 1.25])),
			[true]
		);
		expect(hold.biomassGPerL[3]).toBeCloseTo(2.5 / 1.25, 12);
		// X·V is [1, 2, 3.75, 5]; X·V − 2.5 passes 0 at 1 + 0.5/1.75 h.
		expect(hold.fromH).toBeCloseTo(1 + 0.5 / 1.75, 12);
	});
});

describe('run-out times along the held course', () => {
	it('a line that runs out only past the held biomass never runs out: P would at 2 h, but N holds X·V at 2.5 g < 3 g', () => {
		const input = inputOf([phosphorus, nitrogen], { N: 0.35, P: 0.09 }, course([1, 2, 3, 4]));
		const hold = holdToNutrients(input, [false, true]);
		const [p, n] = findRunoutTimes(input, hold.heldToG);
		expect(p).toBeNull();
		expect(n!.shortFromH).toBeCloseTo(1.5, 12);
		expect(n!.coveredAgainH).toBeNull();
		// Without the hold, P runs out where X·V reaches 3 g: at 2 h.
		expect(findRunoutTimes(input)[0]!.shortFromH).toBeCloseTo(2, 12);
	});

	it('is short only where every condition is met, entering at the latest crossing and leaving at the first', () => {
		// a: [−1, 1, 1, −1] crosses up at 0.5 h and down at 2.5 h; b: [−3, −1, 1, 1] crosses up at 1.5 h.
		expect(
			findStretch(
				[0, 1, 2, 3],
				[
					[-1, 1, 1, -1],
					[-3, -1, 1, 1]
				]
			)
		).toEqual({ shortFromH: 1.5, coveredAgainH: 2.5 });
	});
});
