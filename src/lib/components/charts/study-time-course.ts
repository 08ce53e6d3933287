// What a study's time-course chart shows, for the study page and the print view (and a PDF) alike:
// the course the verdict describes, biomass held to what the required nutrients supply, with the
// model's course past that limit drawn grey.
import type { StudyReport, TimeCourse, TimeCourseHold } from '$chemistry';
import { formatAmount } from '../recipes/format';
import type { ChartMarker, ChartSeries, ChartSpec } from './chart-types';

export type StudyCourse = TimeCourse & {
	demandOurMmolPerLH?: number[] | null;
	nutrientHold?: TimeCourseHold | null;
};

/** The verdict's limit, as the caption compares the chart with it. */
export interface StudyLimit {
	name: string;
	maxBiomassGPerL: number | null;
	safetyFactor: number;
	targetBiomassGPerL: number;
}

/** The report's limit and target as the chart and its caption use them. */
export function studyLimitOf(report: StudyReport): StudyLimit {
	return {
		name: report.limit.name,
		maxBiomassGPerL: report.limit.maxBiomassGPerL,
		safetyFactor: report.inputs.safetyFactor,
		targetBiomassGPerL: report.inputs.targetBiomassGPerL
	};
}

const COLOURS = {
	biomass: '#1f5f4a',
	allowed: '#5a7d2a',
	substrate: '#b7791f',
	volume: '#4a5568',
	oxygen: '#2b6cb0',
	uptake: '#c53030',
	demand: '#9b2c2c',
	beyond: '#9a9a92'
};

const hours = (h: number) => `${formatAmount(Number(h.toFixed(1)))} h`;

/** The study's time course as a chart: x from the run's start to where it ended. */
export function buildStudyTimeCourseChart(
	course: StudyCourse,
	maxOtrAtSetpointMmolPerLH: number,
	targetBiomassGPerL: number | null = null
): ChartSpec {
	const { t } = course;
	const hold = course.nutrientHold ?? null;
	const points = (values: number[], from = 0) =>
		t.flatMap((x, i) => (i >= from ? [{ x, y: values[i] }] : []));
	const level = (y: number) => [t[0], t.at(-1)!].map((x) => ({ x, y }));
	// The grey course starts at the output point before the hold, so it leaves the held line visibly.
	const holdIndex = hold ? Math.max(0, t.findIndex((x) => x >= hold.fromH) - 1) : 0;
	const greyFromX = hold?.fromH;
	const series: ChartSeries[] = [];
	if (course.demandOurMmolPerLH)
		series.push({
			label: 'O2 demand of the plan, mmol/(L·h)',
			points: points(course.demandOurMmolPerLH),
			colour: COLOURS.demand,
			dash: [2, 3],
			axis: 'y2',
			greyFromX
		});
	series.push({ label: 'X, g/L', points: points(course.biomassGPerL), colour: COLOURS.biomass });
	if (hold) {
		series.push({
			label: `X without the ${hold.nutrient} limit, g/L`,
			points: points(hold.carbonOnlyBiomassGPerL, holdIndex),
			colour: COLOURS.beyond,
			dash: [3, 3]
		});
		series.push({
			label: `Most X the ${hold.nutrient} supplied allows, g/L`,
			points: points(hold.allowedGPerL, holdIndex + 1),
			colour: COLOURS.allowed,
			dash: [1, 3]
		});
	}
	if (targetBiomassGPerL !== null)
		series.push({
			label: 'Target X, g/L',
			points: level(targetBiomassGPerL),
			colour: COLOURS.biomass,
			dash: [10, 5]
		});
	series.push(
		{
			label: 'S, g/L',
			points: points(course.substrateGPerL),
			colour: COLOURS.substrate,
			greyFromX
		},
		{
			label: 'V, L',
			points: points(course.volumeL),
			colour: COLOURS.volume,
			dash: [4, 3],
			axis: 'y3'
		},
		{
			label: 'DO, mg/L',
			points: points(course.dissolvedOxygenMgPerL),
			colour: COLOURS.oxygen,
			greyFromX
		},
		{
			label: 'OUR, mmol/(L·h)',
			points: points(course.ourMmolPerLH),
			colour: COLOURS.uptake,
			axis: 'y2',
			greyFromX
		},
		{
			label: 'Max OTR at setpoint',
			points: level(maxOtrAtSetpointMmolPerLH),
			colour: COLOURS.uptake,
			dash: [6, 4],
			axis: 'y2'
		}
	);
	const markers: ChartMarker[] = hold
		? [{ x: hold.fromH, label: `${hold.nutrient} runs out` }]
		: [];
	return {
		id: 'time-course',
		title: 'Biomass, substrate, DO and O2 uptake in this vessel',
		xTitle: 'Time, h',
		yTitle: 'X, S (g/L) · DO (mg/L)',
		y2Title: 'mmol O2/(L·h)',
		y3Title: 'V (L)',
		series,
		markers,
		xMin: t[0],
		xMax: t.at(-1)
	};
}

export interface CaptionLine {
	kind: 'model' | 'nutrientHold' | 'oxygen' | 'event';
	text: string;
}

/** The sentences under the chart: what it shows, where a nutrient holds it, and what is grey. */
export function describeStudyTimeCourse(
	course: StudyCourse,
	limit: StudyLimit | null
): CaptionLine[] {
	const lines: CaptionLine[] = [];
	const say = (kind: CaptionLine['kind'], text: string) => lines.push({ kind, text });
	say(
		'model',
		'Simulated time course in this vessel (Monod growth with Pirt maintenance, oxygen balance): where DO reaches 0, growth runs at what transfer supplies and OUR meets the maximum OTR. The plan’s own O2 demand (dotted) and the maximum OTR at the DO setpoint (dashed) are drawn beside it; V is on the outer right axis.'
	);
	const hold = course.nutrientHold;
	if (hold) {
		const end = hold.allowedGPerL.at(-1)!;
		const verdict =
			limit && limit.name === hold.nutrient && limit.maxBiomassGPerL !== null
				? `; the verdict’s ${formatAmount(limit.maxBiomassGPerL)} g/L keeps the safety factor ${limit.safetyFactor}`
				: '';
		say(
			'nutrientHold',
			`${hold.nutrient} ${hold.fromH <= course.t[0] ? 'is short from the start' : `runs out at ${hours(hold.fromH)}`}: from there X is held to what ${hold.nutrient} has supplied by then (law of the minimum), at most ${formatAmount(end)} g/L in the run’s final volume${verdict}. Past that point the substrate, DO, OUR and O2 demand (grey) and the grey X are those of growth on the carbon source alone, which the medium cannot carry.`
		);
	}
	for (const stretch of course.oxygenLimitedH)
		say('oxygen', `DO at 0 from ${stretch.fromH.toFixed(1)} h to ${stretch.toH.toFixed(1)} h.`);
	for (const e of course.events) say('event', `${e.tH.toFixed(1)} h: ${e.message}`);
	return lines;
}
