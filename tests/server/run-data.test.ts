import { describe, expect, it } from 'vitest';
import {
	buildSimulationRequest,
	createDemoValues,
	readSimulationRequest
} from '$lib/simulation/form-values';
import {
	checkRunData,
	checkTextContent,
	checkUploadFile,
	describeFitFieldPath,
	guessColumnMapping,
	parseRunDataCsv
} from '$lib/simulation/run-data';
import { formatSeriesCsv } from '$lib/simulation/series-csv';

const CSV = [
	'time_h,OD600,glucose_g_per_l',
	'0,0.2,20',
	'1,0.4,19.6',
	'2,abc,19',
	'3,,18',
	'4,-1,17',
	'0.5,1.2,16',
	'5,2.5,15',
	'',
	'6,5,12',
	''
].join('\n');

describe('run-data upload', () => {
	it('refuses files that are not CSV text or are too large, before reading them', () => {
		expect(
			checkUploadFile({
				name: 'run.xlsx',
				size: 100,
				type: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'
			})
		).toMatch(/not a \.csv/);
		expect(checkUploadFile({ name: 'run.csv', size: 3 * 1024 * 1024, type: 'text/csv' })).toMatch(
			/limit is 2 MB/
		);
		expect(checkUploadFile({ name: 'run.csv', size: 0, type: 'text/csv' })).toMatch(/empty/);
		expect(checkUploadFile({ name: 'run.csv', size: 100, type: 'image/png' })).toMatch(
			/image\/png/
		);
		expect(checkUploadFile({ name: 'run.csv', size: 100, type: 'text/csv' })).toBeNull();
		expect(checkTextContent('PK\u0003\u0004\u0000\u0000binary')).toMatch(/binary/);
		expect(checkTextContent('time,od\n0,1\n')).toBeNull();
	});

	it('excludes each bad row with its line and reason, and keeps the rest', () => {
		const table = parseRunDataCsv(CSV);
		const mapping = guessColumnMapping(table.columns);
		expect(mapping).toMatchObject({
			time: 'time_h',
			biomass: 'OD600',
			biomassUnit: 'od',
			substrate: 'glucose_g_per_l'
		});
		const checked = checkRunData(table, { ...mapping, gPerLPerOd: '0.5' });
		const problems = Object.fromEntries(
			checked.verdicts.filter((v) => v.problems.length).map((v) => [v.line, v.problems.join('; ')])
		);
		expect(problems).toEqual({
			4: 'biomass “abc” is not a number',
			5: 'biomass is missing',
			6: 'biomass is negative (-1)',
			7: 'time 0.5 h does not come after 1 h'
		});
		expect(checked.rejectedCount).toBe(4);
		expect(table.blankLines).toBe(1);
		expect(checked.series.timeH).toEqual([0, 1, 5, 6]);
		expect(checked.series.biomassGPerL).toEqual([0.1, 0.2, 1.25, 2.5]);
		expect(checked.lines).toEqual([2, 3, 8, 10]);
		expect(describeFitFieldPath('biomassGPerL.2', checked.lines)).toBe('line 8 of the file');
		expect(describeFitFieldPath('biomassGPerL', checked.lines)).toBe('the biomass column');
		expect(describeFitFieldPath('minRSquared', checked.lines)).toBeNull();
	});

	it('asks for a positive OD conversion factor', () => {
		const table = parseRunDataCsv(CSV);
		const checked = checkRunData(table, { ...guessColumnMapping(table.columns), gPerLPerOd: '0' });
		expect(checked.mappingErrors.gPerLPerOd).toMatch(/above 0/);
		expect(checked.series.timeH).toEqual([]);
	});
});

describe('simulation form values', () => {
	it('builds the demo fed-batch request and reads it back unchanged', () => {
		const built = buildSimulationRequest(createDemoValues());
		expect(built.ok).toBe(true);
		if (!built.ok) return;
		expect(built.request).toMatchObject({
			mode: 'fedBatch',
			feed: { strategy: 'exponential', muSetPerH: 0.2 },
			oxygen: { kLaPerH: 500 }
		});
		expect(built.request).not.toHaveProperty('dilutionPerH');
		const read = readSimulationRequest(built.request);
		expect(read.ok).toBe(true);
		if (read.ok) expect(buildSimulationRequest(read.values)).toEqual(built);
	});

	it('names each blank required field and each non-number', () => {
		const values = createDemoValues();
		values.numbers['kinetics.muMaxPerH'] = '';
		values.numbers['initial.volumeL'] = 'five';
		values.numbers['kinetics.ksGPerL'] = '0,05';
		const built = buildSimulationRequest(values);
		// The blank field is left out; the request schema's word for a missing number is the API's.
		expect(built).toEqual({
			ok: false,
			fieldErrors: {
				'initial.volumeL': 'Volume V₀ (L): “five” is not a number.',
				'kinetics.ksGPerL':
					'Ks (g/L): “0,05” has a decimal comma, but this site writes decimals with a point: type 0.05.',
				'kinetics.muMaxPerH': 'Give a number.'
			}
		});
		if (built.ok) return;
		expect(Object.keys(built.fieldErrors)[0]).toBe('kinetics.ksGPerL');
	});

	it('exports one CSV row per output time, with a scenario column when comparing', () => {
		const result = {
			t: [0, 1],
			biomassGPerL: [1, 2],
			substrateGPerL: [3, 4],
			productGPerL: [0, 0],
			volumeL: [5, 5],
			dissolvedOxygenMgPerL: null,
			feedLPerH: [0, 0.1],
			ourMmolPerLH: null,
			maxOtrMmolPerLH: null
		};
		const single = formatSeriesCsv([{ label: 'A', result }]).split('\n');
		expect(single[0]).toBe(
			't_h,biomass_g_per_l,substrate_g_per_l,product_g_per_l,volume_l,dissolved_oxygen_mg_per_l,feed_l_per_h,our_mmol_per_l_h,max_otr_mmol_per_l_h'
		);
		expect(single[2]).toBe('1,2,4,0,5,,0.1,,');
		const both = formatSeriesCsv([
			{ label: 'A', result },
			{ label: 'B', result }
		]).split('\n');
		expect(both[0].startsWith('scenario,t_h')).toBe(true);
		expect(both).toHaveLength(5);
	});
});
