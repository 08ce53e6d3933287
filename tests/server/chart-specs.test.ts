import { describe, expect, it } from 'vitest';
import type { ChemostatSteadyState, GrowthFit, TimeCourse } from '$chemistry';
import { BEYOND_COLOUR } from '$lib/components/charts/chart-types';
import { buildChemostatChart } from '$lib/components/charts/chemostat-chart';
import { buildGrowthFitSeries } from '$lib/components/charts/growth-fit-chart';
import {
	buildStudyTimeCourseChart,
	describeStudyTimeCourse,
	type StudyCourse
} from '$lib/components/charts/study-time-course';
import { formatRunout } from '$lib/components/studies/format';
import { buildSimulationCharts, type SimulationRunView } from '$lib/simulation/chart-series';
import { createDemoValues, switchOperatingMode } from '$lib/simulation/form-values';

// Series written by hand: what each chart is asked to draw, not the science behind it.
const t = [0, 6, 12, 18, 24];
const course = (hold: StudyCourse['nutrientHold'] = null): StudyCourse =>
	({
		t,
		biomassGPerL: hold ? [0.1, 1, 2, 2, 2] : [0.1, 1, 4, 9, 12],
		substrateGPerL: [20, 18, 12, 4, 0],
		volumeL: [5, 5, 5, 5, 5],
		dissolvedOxygenMgPerL: [7, 6, 5, 4, 3],
		ourMmolPerLH: [1, 5, 10, 20, 25],
		maxOtrMmolPerLH: 40,
		oxygenLimitedH: [],
		events: [],
		finalBiomassGPerL: hold ? 2 : 12,
		reachesTarget: !hold,
		targetReachedAtH: null,
		stoppedAtH: null,
		demandOurMmolPerLH: [1, 5, 10, 20, 25],
		nutrientHold: hold
	}) as TimeCourse & StudyCourse;
const nitrogenHold = {
	fromH: 9,
	nutrient: 'N',
	carbonOnlyBiomassGPerL: [0.1, 1, 4, 9, 12],
	allowedGPerL: [2, 2, 2, 2, 2]
};
const seriesOf = (spec: ReturnType<typeof buildStudyTimeCourseChart>, label: string) =>
	spec.series.find((s) => s.label === label)!;

describe('the study time-course chart', () => {
	it('ends its time axis where the run ended and draws the target', () => {
		const spec = buildStudyTimeCourseChart(course(), 40, 10);
		expect([spec.xMin, spec.xMax]).toEqual([0, 24]);
		expect(seriesOf(spec, 'Target X, g/L').points).toEqual([
			{ x: 0, y: 10 },
			{ x: 24, y: 10 }
		]);
		expect(spec.markers).toEqual([]);
		expect(spec.series.every((s) => s.greyFromX === undefined)).toBe(true);
	});

	it('where a nutrient holds growth: the held X, the model past it in grey from the point before, the limit and a marker', () => {
		const spec = buildStudyTimeCourseChart(course(nitrogenHold), 40, 10);
		expect(Math.max(...seriesOf(spec, 'X, g/L').points.map((p) => p.y))).toBe(2);
		const beyond = seriesOf(spec, 'X without the N limit, g/L');
		expect(beyond.colour).toBe(BEYOND_COLOUR);
		expect(beyond.points[0]).toEqual({ x: 6, y: 1 });
		expect(seriesOf(spec, 'Most X the N supplied allows, g/L').points[0]).toEqual({ x: 12, y: 2 });
		for (const label of [
			'S, g/L',
			'DO, mg/L',
			'OUR, mmol/(L·h)',
			'O2 demand of the plan, mmol/(L·h)'
		])
			expect(seriesOf(spec, label).greyFromX).toBe(9);
		expect(seriesOf(spec, 'V, L').greyFromX).toBeUndefined();
		expect(spec.markers).toEqual([{ x: 9, label: 'N runs out' }]);
	});

	it('says where the nutrient runs out, the most it allows and the verdict’s figure with the safety factor', () => {
		const lines = describeStudyTimeCourse(course(nitrogenHold), {
			name: 'N',
			maxBiomassGPerL: 1.67,
			safetyFactor: 1.2,
			targetBiomassGPerL: 10
		});
		const hold = lines.find((l) => l.kind === 'nutrientHold')!.text;
		expect(hold).toMatch(/^N runs out at 9 h: from there X is held/);
		expect(hold).toContain('at most 2 g/L');
		expect(hold).toContain('the verdict’s 1.67 g/L keeps the safety factor 1.2');
		const fromStart = describeStudyTimeCourse(course({ ...nitrogenHold, fromH: 0 }), null);
		expect(fromStart.find((l) => l.kind === 'nutrientHold')!.text).toMatch(
			/^N is short from the start/
		);
	});
});

describe('the “Short from” cell', () => {
	it('says the start, a time, a time covered again, or why there is none', () => {
		expect(formatRunout({ shortFromH: 0, coveredAgainH: null })).toBe('from the start');
		expect(formatRunout({ shortFromH: 16.4, coveredAgainH: 24.2 })).toBe('16 h (to 24 h)');
		expect(formatRunout(null, 'modelled')).toBe('see S in the time course');
		expect(formatRunout(null, 'lasts')).toBe('lasts the run');
		expect(formatRunout(null, 'no time course')).toBe('no time course');
	});
});

describe('the simulation charts', () => {
	it('end the time axis at the run’s end (24 h), not at a round tick past it', () => {
		const run: SimulationRunView = {
			label: 'Current inputs',
			result: {
				t: [0, 8, 16, 24],
				biomassGPerL: [0.1, 1, 5, 9],
				substrateGPerL: [20, 15, 5, 1],
				productGPerL: [0, 0, 0, 0],
				volumeL: [5, 5, 6, 7.5],
				dissolvedOxygenMgPerL: null,
				feedLPerH: [0, 0.1, 0.15, 0.2],
				feedStreams: null,
				ourMmolPerLH: null,
				maxOtrMmolPerLH: null,
				events: []
			}
		};
		for (const spec of buildSimulationCharts([run])) {
			expect([spec.xMin, spec.xMax]).toEqual([0, 24]);
		}
	});
});

describe('the chemostat chart', () => {
	const result = {
		criticalDilutionPerH: 0.599,
		optimalDilutionPerH: 0.57,
		marginDilutionPerH: 0.539,
		sweep: [
			{ dilutionPerH: 0, biomassGPerL: 10, substrateGPerL: 0, productivityGPerLH: 0 },
			{ dilutionPerH: 0.599, biomassGPerL: 0, substrateGPerL: 20, productivityGPerLH: 0 }
		]
	} as unknown as ChemostatSteadyState;

	it('marks the chosen D apart from what the model finds', () => {
		const spec = buildChemostatChart(result, 0.4);
		expect(spec.markers.filter((m) => m.kind === 'chosen')).toEqual([
			{ x: 0.4, label: 'chosen D 0.400', kind: 'chosen' }
		]);
		expect(spec.markers.map((m) => m.label)).toEqual(
			expect.arrayContaining(['D_opt 0.570', 'D_crit 0.599', 'margin 0.539'])
		);
		expect([spec.xMin, spec.xMax]).toEqual([0, 0.599]);
	});

	it('runs the axis on to a chosen D past washout, so its mark is on the chart', () => {
		expect(buildChemostatChart(result, 0.8).xMax).toBe(0.8);
	});
});

describe('the growth-fit chart', () => {
	const fit = {
		exponentialPhase: { curve: { t: [0, 1], biomassGPerL: [0.1, 0.2] } },
		monodFit: { curve: { t: [0, 1], biomassGPerL: [0.1, 0.2], substrateGPerL: [10, 9.8] } }
	} as unknown as GrowthFit;
	const series = buildGrowthFitSeries(fit, {
		timeH: [0, 1],
		biomassGPerL: [0.1, 0.2],
		substrateGPerL: [10, 9.8]
	});
	const byLabel = (label: string) => series.find((s) => s.label === label)!;

	it('draws measured points as markers and modelled courses as lines, in different colours', () => {
		const measured = byLabel('Substrate, measured (g/L)');
		const model = byLabel('Monod model S');
		expect(measured.scatter).toBe(true);
		expect(model.scatter).toBeFalsy();
		expect(measured.colour).not.toBe(model.colour);
		expect(measured.pointStyle).not.toBe(byLabel('Biomass, measured (g/L)').pointStyle);
		expect(byLabel('Biomass, measured (g/L)').colour).not.toBe(byLabel('Monod model X').colour);
	});

	it('puts substrate on the right axis, leaving the left one to biomass (log scale)', () => {
		expect(series.filter((s) => s.axis === 'y2').map((s) => s.label)).toEqual([
			'Substrate, measured (g/L)',
			'Monod model S'
		]);
	});
});

describe('the simulation form’s defaults follow the operating mode', () => {
	it('a chemostat’s fresh medium starts at S₀, not at the fed-batch concentrate, and goes back', () => {
		const values = createDemoValues();
		expect(values.mode).toBe('fedBatch');
		expect(values.feeds[0].numbers.substrateGPerL).toBe('500');
		switchOperatingMode(values, 'chemostat');
		expect(values.mode).toBe('chemostat');
		expect(values.feeds[0].numbers.substrateGPerL).toBe(values.numbers['initial.substrateGPerL']);
		switchOperatingMode(values, 'perfusion');
		expect(values.feeds[0].numbers.substrateGPerL).toBe('20');
		switchOperatingMode(values, 'fedBatch');
		expect(values.feeds[0].numbers.substrateGPerL).toBe('500');
	});

	it('keeps a substrate the user typed', () => {
		const values = createDemoValues();
		values.feeds[0].numbers.substrateGPerL = '300';
		switchOperatingMode(values, 'chemostat');
		expect(values.feeds[0].numbers.substrateGPerL).toBe('300');
	});
});
