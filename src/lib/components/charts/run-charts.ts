// What the run page and the kLa pages draw: the plan as lines, the run's data as markers or thin
// lines, each quantity in its own colour, on shared time axes.
import type { PlannedCourse, TimeSeries } from '$chemistry';
import type { RunSignal } from '$lib/runs/signals';
import { SERIES_COLOURS, type ChartMarker, type ChartSeries, type ChartSpec } from './chart-types';

const [green, grain, blue, brick, moss, plum] = SERIES_COLOURS;
const PLAN_DASH = [6, 3];

/** What the run page receives from the analysis endpoint, as far as the charts read it. */
export interface RunChartData {
	plan: PlannedCourse | null;
	chart: Partial<Record<RunSignal, TimeSeries>>;
	gas: { timeH: number[]; ourMmolPerLH: number[] } | null;
	comparison: {
		flags: { atH: number; kind: string }[];
		projection: { targetAtH: number | null; oxygenLimitAtH: number | null } | null;
	} | null;
	initialVolumeL: number;
}

const points = (timeH: number[], values: number[]) => timeH.map((x, i) => ({ x, y: values[i] }));
const measured = (s: TimeSeries | undefined) => (s ? points(s.timeH, s.value) : []);

function planned(plan: PlannedCourse | null, values: (p: PlannedCourse) => number[]) {
	return plan ? points(plan.timeH, values(plan)) : [];
}

function withData(series: ChartSeries[]): ChartSeries[] {
	return series.filter((s) => s.points.length > 0);
}

function projectionMarkers(data: RunChartData): ChartMarker[] {
	const p = data.comparison?.projection;
	const markers: ChartMarker[] = [];
	if (p?.targetAtH != null) markers.push({ x: p.targetAtH, label: 'Target, projected' });
	if (p?.oxygenLimitAtH != null)
		markers.push({ x: p.oxygenLimitAtH, label: 'O₂ limit, projected' });
	return markers;
}

function xRange(data: RunChartData) {
	const ends = [
		...(data.plan ? [data.plan.timeH[data.plan.timeH.length - 1]] : []),
		...Object.values(data.chart).map((s) => s!.timeH[s!.timeH.length - 1])
	];
	return ends.length ? { xMin: 0, xMax: Math.max(...ends) } : {};
}

export function buildPlanVsActualCharts(data: RunChartData): ChartSpec[] {
	const range = xRange(data);
	const markers = projectionMarkers(data);
	const growth: ChartSpec = {
		id: 'run-growth',
		title: 'Biomass and substrate',
		xTitle: 'Time (h)',
		yTitle: 'Biomass (g/L)',
		y2Title: 'Substrate (g/L)',
		yLog: false,
		...range,
		markers,
		series: withData([
			{
				label: 'X, plan',
				points: planned(data.plan, (p) => p.biomassGPerL),
				colour: green,
				dash: PLAN_DASH
			},
			{
				label: 'X, measured (dry weight)',
				points: measured(data.chart.dry_weight_g_per_l),
				colour: green,
				scatter: true,
				pointStyle: 'circle'
			},
			{
				label: 'S, plan',
				points: planned(data.plan, (p) => p.substrateGPerL),
				colour: grain,
				dash: PLAN_DASH,
				axis: 'y2'
			},
			{
				label: 'S, measured',
				points: measured(data.chart.substrate_g_per_l),
				colour: grain,
				scatter: true,
				pointStyle: 'rect',
				axis: 'y2'
			}
		])
	};
	const oxygen: ChartSpec = {
		id: 'run-oxygen',
		title: 'Dissolved oxygen',
		xTitle: 'Time (h)',
		yTitle: 'DO (% of air saturation)',
		...range,
		markers,
		series: withData([
			{
				label: 'DO, plan',
				points: planned(data.plan, (p) => p.dissolvedOxygenPercent),
				colour: blue,
				dash: PLAN_DASH
			},
			{ label: 'DO, measured', points: measured(data.chart.do_percent), colour: blue }
		])
	};
	const maxOtr = data.plan?.maxOtrMmolPerLH ?? null;
	const uptake: ChartSpec = {
		id: 'run-uptake',
		title: 'Oxygen uptake and the vessel’s transfer limit',
		xTitle: 'Time (h)',
		yTitle: 'mmol/L/h',
		...range,
		markers,
		series: withData([
			{
				label: 'OUR, plan',
				points: planned(data.plan, (p) => p.ourMmolPerLH),
				colour: brick,
				dash: PLAN_DASH
			},
			{
				label: 'OUR, from off-gas',
				points: data.gas ? points(data.gas.timeH, data.gas.ourMmolPerLH) : [],
				colour: brick
			},
			{
				label: 'Max OTR (kLa·C*)',
				points:
					maxOtr !== null && range.xMax !== undefined
						? [
								{ x: 0, y: maxOtr },
								{ x: range.xMax, y: maxOtr }
							]
						: [],
				colour: plum,
				dash: [2, 3]
			}
		])
	};
	const feed: ChartSpec = {
		id: 'run-volume',
		title: 'Feed added',
		xTitle: 'Time (h)',
		yTitle: 'Feed added (L)',
		...range,
		markers: [],
		series: withData([
			{
				label: 'Feed added, plan',
				points: planned(data.plan, (p) => p.volumeL.map((v) => v - data.initialVolumeL)),
				colour: moss,
				dash: PLAN_DASH
			},
			{ label: 'Feed added, logged', points: measured(data.chart.feed_volume_l), colour: moss }
		])
	};
	return [growth, oxygen, uptake, feed];
}

/** A gassing-out curve: the readings as markers and the fitted probe reading as a line. */
export function buildKlaFitChart(
	readings: { timeS: number[]; dissolvedOxygen: number[] },
	curve: { timeS: number[]; dissolvedOxygen: number[] },
	unitLabel: string
): ChartSpec {
	return {
		id: 'kla-fit',
		title: 'Re-aeration and the fitted curve',
		xTitle: 'Time (s)',
		yTitle: `DO (${unitLabel})`,
		markers: [],
		series: [
			{
				label: 'DO, measured',
				points: points(readings.timeS, readings.dissolvedOxygen),
				colour: blue,
				scatter: true,
				pointStyle: 'circle'
			},
			{ label: 'Fitted', points: points(curve.timeS, curve.dissolvedOxygen), colour: brick }
		]
	};
}

/** What the fit leaves: reading − fitted probe reading at each point used, which should scatter about 0 without a pattern. */
export function buildKlaResidualChart(
	timeS: number[],
	residuals: number[],
	unitLabel: string
): ChartSpec {
	const used = timeS.slice(timeS.length - residuals.length);
	return {
		id: 'kla-residuals',
		title: 'Residuals',
		xTitle: 'Time (s)',
		yTitle: `Reading − fitted (${unitLabel})`,
		markers: [],
		series: [
			{
				label: 'Residual',
				points: points(used, residuals),
				colour: grain,
				scatter: true,
				pointStyle: 'rect'
			},
			{
				label: 'Zero',
				points: used.length
					? [
							{ x: used[0], y: 0 },
							{ x: used[used.length - 1], y: 0 }
						]
					: [],
				colour: '#9a9a92',
				dash: [4, 4]
			}
		]
	};
}

/** Each measured kLa against what the fitted correlation gives at its P/V and v_s, with the line of equality. */
export function buildKlaMapChart(
	fitted: { kLaPerS: number; predictedKLaPerS: number }[]
): ChartSpec {
	const pairs = fitted.map((p) => ({ x: p.kLaPerS * 3600, y: p.predictedKLaPerS * 3600 }));
	const all = pairs.flatMap((p) => [p.x, p.y]);
	const low = Math.min(...all) * 0.9;
	const high = Math.max(...all) * 1.1;
	return {
		id: 'kla-map',
		title: 'Measured against fitted kLa',
		xTitle: 'kLa measured (1/h)',
		yTitle: 'kLa fitted (1/h)',
		markers: [],
		xMin: low,
		xMax: high,
		series: [
			{ label: 'Points', points: pairs, colour: green, scatter: true, pointStyle: 'circle' },
			{
				label: 'Equal',
				points: [
					{ x: low, y: low },
					{ x: high, y: high }
				],
				colour: '#9a9a92',
				dash: [4, 4]
			}
		]
	};
}
