// What the chemostat chart shows: steady states against D from 0 to D_crit (or on to the chosen D,
// when it is past washout), with D_opt, D_crit, the margin point and the chosen D marked.
import type { ChemostatSteadyState } from '$chemistry';
import { SERIES_COLOURS, type ChartMarker, type ChartSpec } from './chart-types';

const fmt = (v: number) => v.toPrecision(3);
const [green, grain, , brick] = SERIES_COLOURS;

export function buildChemostatChart(
	result: ChemostatSteadyState,
	chosenDilutionPerH: number
): ChartSpec {
	const { sweep } = result;
	const at = (pick: (p: ChemostatSteadyState['sweep'][number]) => number) =>
		sweep.map((p) => ({ x: p.dilutionPerH, y: pick(p) }));
	const markers: ChartMarker[] = [
		{ x: result.optimalDilutionPerH, label: `D_opt ${fmt(result.optimalDilutionPerH)}` },
		{ x: result.criticalDilutionPerH, label: `D_crit ${fmt(result.criticalDilutionPerH)}` },
		...(result.marginDilutionPerH !== undefined
			? [{ x: result.marginDilutionPerH, label: `margin ${fmt(result.marginDilutionPerH)}` }]
			: []),
		{ x: chosenDilutionPerH, label: `chosen D ${fmt(chosenDilutionPerH)}`, kind: 'chosen' }
	];
	return {
		id: 'chemostat',
		title: 'Steady states against dilution rate',
		xTitle: 'Dilution rate D (1/h)',
		yTitle: 'Concentration (g/L)',
		y2Title: 'Productivity (g/L/h)',
		series: [
			{ label: 'Biomass X (g/L)', points: at((p) => p.biomassGPerL), colour: green },
			{ label: 'Substrate S (g/L)', points: at((p) => p.substrateGPerL), colour: grain },
			{
				label: 'Productivity D·X (g/L/h)',
				points: at((p) => p.productivityGPerLH),
				colour: brick,
				axis: 'y2'
			}
		],
		markers,
		xMin: 0,
		xMax: Math.max(result.criticalDilutionPerH, chosenDilutionPerH)
	};
}
