// What the growth-fit chart shows: measured points as markers, fitted and modelled courses as lines,
// each quantity in its own colour, biomass on the left (log) axis and substrate on the right.
import type { GrowthFit } from '$chemistry';
import { SERIES_COLOURS, type ChartSeries } from './chart-types';

interface MeasuredRun {
	timeH: number[];
	biomassGPerL: number[];
	substrateGPerL?: number[] | null;
}

const [green, grain, blue, brick, , plum] = SERIES_COLOURS;

export function buildGrowthFitSeries(fit: GrowthFit, data: MeasuredRun): ChartSeries[] {
	const measured = (values: number[]) => data.timeH.map((x, i) => ({ x, y: values[i] }));
	const curve = (t: number[], values: number[]) => t.map((x, i) => ({ x, y: values[i] }));
	const phase = fit.exponentialPhase;
	const series: ChartSeries[] = [
		{
			label: 'Biomass, measured (g/L)',
			points: measured(data.biomassGPerL),
			colour: green,
			scatter: true,
			pointStyle: 'circle'
		},
		{
			label: 'Exponential phase fit',
			points: curve(phase.curve.t, phase.curve.biomassGPerL),
			colour: brick,
			dash: [6, 3]
		}
	];
	if (data.substrateGPerL)
		series.push({
			label: 'Substrate, measured (g/L)',
			points: measured(data.substrateGPerL),
			colour: grain,
			scatter: true,
			pointStyle: 'rect',
			axis: 'y2'
		});
	if (fit.monodFit) {
		const { t, biomassGPerL, substrateGPerL } = fit.monodFit.curve;
		series.push(
			{ label: 'Monod model X', points: curve(t, biomassGPerL), colour: blue },
			{ label: 'Monod model S', points: curve(t, substrateGPerL), colour: plum, axis: 'y2' }
		);
	}
	return series;
}
