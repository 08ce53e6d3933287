import Papa from 'papaparse';
import type { SimulationResult } from '$chemistry';

export type SimulationSeries = Pick<
	SimulationResult,
	't' | 'biomassGPerL' | 'substrateGPerL' | 'productGPerL' | 'volumeL' | 'dissolvedOxygenMgPerL' | 'feedLPerH' | 'ourMmolPerLH' | 'maxOtrMmolPerLH'
>;

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

/** One row per output time; with several runs, a leading scenario column tells them apart. */
export function formatSeriesCsv(runs: { label: string; result: SimulationSeries }[]): string {
	const withLabel = runs.length > 1;
	const fields = [...(withLabel ? ['scenario'] : []), ...SERIES_COLUMNS.map(([name]) => name)];
	const data: (string | number)[][] = [];
	for (const { label, result } of runs) {
		result.t.forEach((_, i) => {
			const row = SERIES_COLUMNS.map(([, key]) => result[key]?.[i] ?? '');
			data.push(withLabel ? [label, ...row] : row);
		});
	}
	return Papa.unparse({ fields, data }, { newline: '\n' });
}
