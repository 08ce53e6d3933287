import { describe, expect, it } from 'vitest';
import { findEmptyTime, findRunoutTimes, type PlanCourse, type SufficiencyLine } from '$chemistry';

// Courses written by hand, 1 L throughout; a feed delivers 0.1 L/h. The demand per g biomass is
// r = 0.56 g/L / 4 g/L = 0.14 g/g; the deficit at t is r·X(t)·V − basal − c_feed·min(delivered(t), available),
// worked out by hand below and crossed by linear interpolation between the output points.
const course = (biomassGPerL: number[]) =>
	({
		t: [0, 1, 2, 3],
		biomassGPerL,
		volumeL: [1, 1, 1, 1],
		deliveries: [{ deliveredL: 0.3, cumulativeL: [0, 0.1, 0.2, 0.3] }]
	}) as unknown as PlanCourse;
const rising = course([1, 2, 3, 4]);

const nitrogen = { key: 'N', basis: 'element', demandGPerL: 0.56 } as SufficiencyLine;
const basal = (nGPerL: number) => ({
	versionId: 'b',
	label: 'basal',
	temperatureC: 20,
	composition: { elementsGPerL: { N: nGPerL }, componentsGPerL: {} }
});
const feed = (nGPerL: number) => ({
	...basal(nGPerL),
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
const runoutOf = (
	basalN: number,
	biomass: PlanCourse,
	feeds: { nGPerL: number; availableL: number }[] = []
) =>
	findRunoutTimes({
		lines: [nitrogen],
		targetBiomassGPerL: 4,
		basal: basal(basalN),
		initialVolumeL: 1,
		feeds: feeds.map((f) => feed(f.nGPerL)),
		availableL: feeds.map((f) => f.availableL),
		course: biomass
	})[0];

describe('when a nutrient runs out along the run', () => {
	it('basal 0.35 g/L N alone: deficit [−0.21, −0.07, 0.07, 0.21], short from 1 + 0.07/0.14 = 1.5 h', () => {
		const runout = runoutOf(0.35, rising)!;
		expect(runout.shortFromH).toBeCloseTo(1.5, 12);
		expect(runout.coveredAgainH).toBeNull();
	});

	it('a feed of 5 g/L N keeps it covered: deficit [−0.21, −0.57, −0.93, −1.29]', () => {
		expect(runoutOf(0.35, rising, [{ nGPerL: 5, availableL: 0.3 }])).toBeNull();
	});

	it('short from the start: basal 0.1 g/L and a 0.5 g/L feed, deficit [0.04, 0.13, 0.22, 0.31]', () => {
		expect(runoutOf(0.1, rising, [{ nGPerL: 0.5, availableL: 0.3 }])).toEqual({
			shortFromH: 0,
			coveredAgainH: null
		});
	});

	it('counts a feed only up to what is available: 3 g/L N capped at 0.1 L, deficit [−0.06, −0.22, −0.08, 0.06], short from 2 + 0.08/0.14 h', () => {
		const runout = runoutOf(0.2, rising, [{ nGPerL: 3, availableL: 0.1 }])!;
		expect(runout.shortFromH).toBeCloseTo(2 + 0.08 / 0.14, 12);
		expect(runout.coveredAgainH).toBeNull();
	});

	it('notes when a feed covers it again: X [1, 3.5, 3.5, 3.5], basal 0.24, feed 2 g/L; deficit [−0.10, 0.05, −0.15, −0.35]', () => {
		// Up-crossing at 0 + 0.10/0.15 h; down-crossing at 1 + 0.05/0.20 = 1.25 h.
		const runout = runoutOf(0.24, course([1, 3.5, 3.5, 3.5]), [{ nGPerL: 2, availableL: 0.3 }])!;
		expect(runout.shortFromH).toBeCloseTo(0.1 / 0.15, 12);
		expect(runout.coveredAgainH).toBeCloseTo(1.25, 12);
	});
});

describe('when a limited feed runs dry', () => {
	it('interpolates where the cumulative volume passes what is available: 0.25 L at 2.5 h', () => {
		expect(findEmptyTime([0, 1, 2, 3], [0, 0.1, 0.2, 0.3], 0.25)).toBeCloseTo(2.5, 12);
		expect(findEmptyTime([0, 1, 2, 3], [0, 0.1, 0.2, 0.3], 0.3)).toBeNull();
	});
});
