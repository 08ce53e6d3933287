import type { SimulationEvent, SimulationEventKind } from '$chemistry';
import {
	SCENARIO_DASHES,
	SERIES_COLOURS,
	type ChartMarker,
	type ChartSeries,
	type ChartSpec
} from '$lib/components/charts/chart-types';
import { feedStreamName, separateFeedStreams } from './feed-stream-results';
import type { SimulationSeries } from './series-csv';

export interface SimulationRunView {
	label: string;
	result: SimulationSeries & { events: SimulationEvent[]; stoppedAtH?: number };
}

export const EVENT_LABELS: Record<SimulationEventKind, string> = {
	substrateExhausted: 'Substrate exhausted',
	oxygenLimited: 'Oxygen-limited',
	oxygenDepleted: 'DO at 0: growth held to transfer',
	maxVolumeReached: 'Maximum volume',
	washout: 'Washout',
	feedStarted: 'Feed started',
	draw: 'Draw'
};

type Quantity = {
	key: Exclude<keyof SimulationSeries, 'feedStreams'>;
	label: string;
	colour: string;
	axis?: 'y' | 'y2';
};

export type { ChartSpec };

/** Where the runs start and end, h: the time axis ends where the longest run ended, not at a round tick. */
export function findRunSpanH(runs: SimulationRunView[]): { startH: number; endH: number } | null {
	const ran = runs.filter((run) => run.result.t.length > 0);
	if (ran.length === 0) return null;
	return {
		startH: Math.min(...ran.map((run) => run.result.t[0])),
		endH: Math.max(...ran.map((run) => run.result.t.at(-1)!))
	};
}

/** A series as points; a run-wide figure (the maximum OTR) is a level line from start to end. */
function toPoints(t: number[], values: number[] | number | null): { x: number; y: number }[] {
	if (values === null) return [];
	if (typeof values === 'number')
		return t.length === 0 ? [] : [t[0], t[t.length - 1]].map((x) => ({ x, y: values }));
	return t.map((x, i) => ({ x, y: values[i] }));
}

/** Colours of the separate feed streams, apart from the volume's blue and the total feed's brick. */
const [green, grain, blue, brick, moss, plum] = SERIES_COLOURS;
const STREAM_COLOURS = [green, grain, moss, plum];

/**
 * Each feed stream's rate beside the total, on the feed-rate axis; only runs with several streams
 * have them (a lone stream's rate is the total).
 */
function feedStreamSeries(runs: SimulationRunView[]): ChartSeries[] {
	const many = runs.length > 1;
	return runs.flatMap((run, r) =>
		separateFeedStreams(run.result).map((stream, i) => {
			const name = feedStreamName(stream, i);
			return {
				label: many ? `${run.label}: ${name}` : name,
				points: toPoints(run.result.t, stream.feedLPerH),
				colour: STREAM_COLOURS[i % STREAM_COLOURS.length],
				dash: SCENARIO_DASHES[r % SCENARIO_DASHES.length],
				axis: 'y2' as const
			};
		})
	);
}

/** The four chart groups; a second run is drawn in the same colours with a dashed line. */
export function buildSimulationCharts(runs: SimulationRunView[]): ChartSpec[] {
	const many = runs.length > 1;
	const span = findRunSpanH(runs);
	const markers: ChartMarker[] = runs.flatMap((run) =>
		run.result.events
			.filter((e) => e.kind !== 'draw')
			.map((e) => ({
				x: e.tH,
				label: `${many ? `${run.label}: ` : ''}${EVENT_LABELS[e.kind] ?? e.kind}`
			}))
	);
	const chart = (
		id: string,
		title: string,
		yTitle: string,
		quantities: Quantity[],
		y2Title?: string
	): ChartSpec => ({
		id,
		title,
		xTitle: 'Time (h)',
		yTitle,
		y2Title,
		xMin: span?.startH,
		xMax: span?.endH,
		markers,
		series: runs.flatMap((run, r) =>
			quantities
				.filter((q) => run.result[q.key] !== null)
				.map((q) => ({
					label: many ? `${run.label}: ${q.label}` : q.label,
					points: toPoints(run.result.t, run.result[q.key]),
					colour: q.colour,
					dash: SCENARIO_DASHES[r % SCENARIO_DASHES.length],
					axis: q.axis
				}))
		)
	});
	const streams = feedStreamSeries(runs);
	const volume = chart(
		'volume',
		'Volume and feed rate',
		'Volume (L)',
		[
			{ key: 'volumeL', label: 'Volume V', colour: blue },
			{
				key: 'feedLPerH',
				label: streams.length ? 'Total feed rate F' : 'Feed rate F',
				colour: brick,
				axis: 'y2'
			}
		],
		'Feed rate (L/h)'
	);
	volume.series.push(...streams);
	const specs = [
		chart('concentrations', 'Biomass, substrate and product', 'Concentration (g/L)', [
			{ key: 'biomassGPerL', label: 'Biomass X', colour: green },
			{ key: 'substrateGPerL', label: 'Substrate S', colour: grain },
			{ key: 'productGPerL', label: 'Product P', colour: moss }
		]),
		volume
	];
	if (runs.some((run) => run.result.dissolvedOxygenMgPerL !== null)) {
		specs.push(
			chart('oxygen', 'Dissolved oxygen', 'DO (mg/L)', [
				{ key: 'dissolvedOxygenMgPerL', label: 'DO', colour: blue }
			])
		);
		specs.push(
			chart('uptake', 'Oxygen uptake against the maximum transfer rate', 'Rate (mmol O₂/L/h)', [
				{ key: 'ourMmolPerLH', label: 'OUR', colour: green },
				{ key: 'maxOtrMmolPerLH', label: 'Maximum OTR (kLa·C*)', colour: brick }
			])
		);
	}
	return specs;
}
