import { formatAmount } from '$lib/components/studies/format';
import { A4, MARGIN, type Writer } from '../pdf/layout';
import {
	drawLineChart,
	measureLineChartPt,
	type LineChartSpec,
	type LineStyle
} from '../pdf/line-chart';
import type { StudyReport } from './types';

type Course = Extract<StudyReport['timeCourse'], { t: number[] }>;

/** Each line its own colour and its own dash, so the charts read on a black-and-white printout. */
const STYLES = {
	biomass: { color: [0.12, 0.37, 0.29], widthPt: 1.6 },
	substrate: { color: [0.72, 0.47, 0.12], dashPt: [5, 2.5] },
	target: { color: [0.35, 0.35, 0.35], dashPt: [1, 2], widthPt: 1 },
	our: { color: [0.77, 0.19, 0.19], widthPt: 1.4 },
	demand: { color: [0.45, 0.1, 0.1], dashPt: [1, 2] },
	maxOtr: { color: [0.1, 0.1, 0.1], dashPt: [6, 3] },
	dissolvedOxygen: { color: [0.17, 0.42, 0.69], widthPt: 1.4 },
	volume: { color: [0.29, 0.33, 0.41], widthPt: 1.4, dashPt: [4, 2] },
	vesselMax: { color: [0.1, 0.1, 0.1], dashPt: [6, 3] }
} satisfies Record<string, LineStyle>;

const TIME_LABEL = 'Time, h';
const DO_AT_ZERO = 'DO at 0';
const COLUMN_GAP_PT = 18;
const PLOT_HEIGHT_PT = 105;
const CAPTION_PT = 8.5;

function oxygenLimitedBands(course: Course) {
	return course.oxygenLimitedH.map((s) => ({ fromX: s.fromH, toX: s.toH }));
}

function growthChart(course: Course, runEndH: number, targetGPerL: number): LineChartSpec {
	return {
		title: 'Biomass and substrate, g/L',
		xLabel: TIME_LABEL,
		xEnd: runEndH,
		series: [
			{ label: 'Biomass X', xs: course.t, ys: course.biomassGPerL, style: STYLES.biomass },
			{ label: 'Substrate S', xs: course.t, ys: course.substrateGPerL, style: STYLES.substrate }
		],
		levels: [{ label: 'Target X', value: targetGPerL, style: STYLES.target }]
	};
}

function oxygenChart(course: Course, runEndH: number, maxOtrMmolPerLH: number): LineChartSpec {
	const demand = course.demandOurMmolPerLH;
	return {
		title: 'Oxygen uptake and transfer, mmol O2/(L·h)',
		xLabel: TIME_LABEL,
		xEnd: runEndH,
		series: [
			{ label: 'OUR in this vessel', xs: course.t, ys: course.ourMmolPerLH, style: STYLES.our },
			...(demand
				? [{ label: 'O2 demand of the plan', xs: course.t, ys: demand, style: STYLES.demand }]
				: [])
		],
		levels: [{ label: 'Max OTR at DO setpoint', value: maxOtrMmolPerLH, style: STYLES.maxOtr }],
		bands: oxygenLimitedBands(course),
		bandLabel: DO_AT_ZERO
	};
}

function dissolvedOxygenChart(course: Course, runEndH: number): LineChartSpec {
	return {
		title: 'Dissolved oxygen, mg/L',
		xLabel: TIME_LABEL,
		xEnd: runEndH,
		series: [
			{
				label: 'DO',
				xs: course.t,
				ys: course.dissolvedOxygenMgPerL,
				style: STYLES.dissolvedOxygen
			}
		],
		bands: oxygenLimitedBands(course),
		bandLabel: DO_AT_ZERO
	};
}

function volumeChart(course: Course, runEndH: number, vesselMaxL: number): LineChartSpec {
	return {
		title: 'Broth volume, L',
		xLabel: TIME_LABEL,
		xEnd: runEndH,
		series: [{ label: 'Volume V', xs: course.t, ys: course.volumeL, style: STYLES.volume }],
		levels: [{ label: "Vessel's maximum", value: vesselMaxL, style: STYLES.vesselMax }]
	};
}

const CHART_WIDTH_PT = (A4[0] - 2 * MARGIN - COLUMN_GAP_PT) / 2;

function rowHeightPt(w: Writer, row: LineChartSpec[]): number {
	const fonts = { font: w.font, bold: w.bold };
	return Math.max(
		...row.map((spec) => measureLineChartPt(fonts, CHART_WIDTH_PT, spec, PLOT_HEIGHT_PT))
	);
}

/** The charts in rows of two, each row on one page. */
function drawChartRows(w: Writer, rows: LineChartSpec[][]): void {
	const fonts = { font: w.font, bold: w.bold };
	for (const row of rows) {
		const heightPt = rowHeightPt(w, row);
		w.ensure(heightPt);
		row.forEach((spec, i) => {
			const frame = {
				x: MARGIN + i * (CHART_WIDTH_PT + COLUMN_GAP_PT),
				top: w.y,
				widthPt: CHART_WIDTH_PT,
				plotHeightPt: PLOT_HEIGHT_PT
			};
			drawLineChart(w.page, fonts, frame, spec);
		});
		w.y -= heightPt + 6;
	}
}

function chartRows(report: StudyReport, course: Course, runEndH: number): LineChartSpec[][] {
	return [
		[
			growthChart(course, runEndH, report.inputs.targetBiomassGPerL),
			oxygenChart(course, runEndH, report.oxygen.maxOtrMmolPerLH)
		],
		[dissolvedOxygenChart(course, runEndH), volumeChart(course, runEndH, report.volume.maxL)]
	];
}

/** The simulated time course: what it reaches, its charts, and the hours worth knowing. */
export function writeTimeCourse(w: Writer, report: StudyReport, runEndH: number): void {
	const course = report.timeCourse;
	if (course.check === 'unavailable') {
		w.heading('Time course', { keepWithNextPt: 12 });
		w.text(`Not available: ${course.message}`);
		w.gap(10);
		return;
	}
	const rows = chartRows(report, course, runEndH);
	const caption = `Simulated in this vessel (Monod growth with Pirt maintenance, oxygen balance): reaches ${formatAmount(course.finalBiomassGPerL)} g/L${course.stoppedAtH !== null ? `, stops at ${formatAmount(course.stoppedAtH)} h` : ''}. Where DO reaches 0 (shaded), growth runs at what transfer supplies and OUR meets the maximum OTR.`;
	const captionPt = w.lines(caption, { size: CAPTION_PT }).length * (CAPTION_PT + 3) + 4;
	w.heading(`Time course: ${course.check}`, {
		keepWithNextPt: captionPt + rowHeightPt(w, rows[0])
	});
	w.text(caption, { size: CAPTION_PT });
	w.gap(4);
	drawChartRows(w, rows);
	for (const stretch of course.oxygenLimitedH)
		w.text(`DO at 0 from ${stretch.fromH.toFixed(1)} h to ${stretch.toH.toFixed(1)} h.`, {
			size: CAPTION_PT
		});
	for (const event of course.events)
		w.text(`${event.tH.toFixed(1)} h: ${event.message}`, { size: CAPTION_PT });
	w.gap(10);
}
