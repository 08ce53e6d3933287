import Papa from 'papaparse';
import { FORMULA_START } from '$lib/csv-formula';
import type { SimulationResult } from '$chemistry';
import { separateFeedStreams, type FeedStreamsOfRun } from './feed-stream-results';

export type SimulationSeries = Pick<
	SimulationResult,
	| 't'
	| 'biomassGPerL'
	| 'substrateGPerL'
	| 'productGPerL'
	| 'volumeL'
	| 'dissolvedOxygenMgPerL'
	| 'feedLPerH'
	| 'ourMmolPerLH'
	| 'maxOtrMmolPerLH'
> &
	FeedStreamsOfRun;

export const SERIES_COLUMNS = [
	['t_h', 't'],
	['biomass_g_per_l', 'biomassGPerL'],
	['substrate_g_per_l', 'substrateGPerL'],
	['product_g_per_l', 'productGPerL'],
	['volume_l', 'volumeL'],
	['dissolved_oxygen_mg_per_l', 'dissolvedOxygenMgPerL'],
	['feed_l_per_h', 'feedLPerH'],
	['our_mmol_per_l_h', 'ourMmolPerLH'],
	['max_otr_mmol_per_l_h', 'maxOtrMmolPerLH']
] as const satisfies readonly (readonly [string, keyof SimulationSeries])[];

/**
 * The header of each stream's own rate column, by place in the request: `feed_2_l_per_h (Glucose)`.
 * When compared runs name a place differently, every name is given.
 */
function streamColumnNames(runs: { result: SimulationSeries }[]): string[] {
	const count = Math.max(0, ...runs.map(({ result }) => separateFeedStreams(result).length));
	return Array.from({ length: count }, (_, i) => {
		const labels = new Set(
			runs.flatMap(({ result }) =>
				separateFeedStreams(result)
					.slice(i, i + 1)
					.map((stream) => stream.label ?? '')
			)
		);
		const named = [...labels].filter(Boolean);
		const column = `feed_${i + 1}_l_per_h`;
		return named.length ? `${column} (${named.join(' / ')})` : column;
	});
}

/** A series' value at point `i`; a run-wide figure (the maximum OTR) is repeated on every row. */
function valueAt(values: number[] | number | null | undefined, i: number): number | '' {
	if (typeof values === 'number') return values;
	return values?.[i] ?? '';
}

/**
 * One row per output time; with several runs, a leading scenario column tells them apart. A run
 * with several feed streams adds one rate column per stream after the others.
 */
export function formatSeriesCsv(runs: { label: string; result: SimulationSeries }[]): string {
	const withLabel = runs.length > 1;
	const streamColumns = streamColumnNames(runs);
	const fields = [
		...(withLabel ? ['scenario'] : []),
		...SERIES_COLUMNS.map(([name]) => name),
		...streamColumns
	];
	const data: (string | number)[][] = [];
	for (const { label, result } of runs) {
		const streams = separateFeedStreams(result);
		result.t.forEach((_, i) => {
			const row = [
				...SERIES_COLUMNS.map(([, key]) => valueAt(result[key], i)),
				...streamColumns.map((_, s) => streams[s]?.feedLPerH[i] ?? '')
			];
			data.push(withLabel ? [label, ...row] : row);
		});
	}
	// Scenario and feed-stream names are typed by people: the same formula rule as every export.
	return Papa.unparse({ fields, data }, { newline: '\n', escapeFormulae: FORMULA_START });
}
