import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { study } from '$lib/server/db/schema';
import {
	readPointObjects,
	readRows,
	readRunCsv,
	type ReadResult,
	type RowProblem
} from '$lib/server/runs/read-points';
import { createRun, runSchema } from '$lib/server/runs/run-store';
import { readChartSeries, readDataPage, readSeries } from '$lib/server/runs/series-read';
import { storePoints } from '$lib/server/runs/store-points';
import { makeUser, refusalOf } from './helpers';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

// The site zone is UTC until set, so '2026-03-02T08:00' is this moment.
const STARTED_AT_MS = Date.UTC(2026, 2, 2, 8, 0);

let actor: { id: string; email: string };

beforeAll(async () => {
	const person = await makeUser(['engineer']);
	actor = { id: person.id, email: person.email };
});

function newRun(name: string): string {
	const plan = db.select().from(study).get()!;
	const form = runSchema.parse({
		name,
		studyId: plan.id,
		startedAt: '2026-03-02T08:00',
		gasReferenceTemperatureC: '0',
		gasReferencePressureKPa: '101.325'
	});
	return createRun(actor, form).id;
}

function pointCount(runId: string): number {
	const row = db.$client
		.prepare(
			'SELECT count(*) AS n FROM run_point p JOIN run_series s ON s.key = p.series_key WHERE s.run_id = ?'
		)
		.get(runId) as { n: number };
	return row.n;
}

function timeCount(runId: string): number {
	const row = db.$client
		.prepare('SELECT count(*) AS n FROM run_time WHERE run_id = ?')
		.get(runId) as { n: number };
	return row.n;
}

/** What the data endpoint does with a CSV: read all of it, store only when all of it is valid. */
function upload(runId: string, csv: string, onConflict: 'refuse' | 'replace' = 'refuse') {
	const read = readRunCsv(csv, STARTED_AT_MS);
	if (!read.ok) return { problems: read.problems };
	return { stored: storePoints(actor, runId, read.batch, { source: 'csv', onConflict }) };
}

function problemsOf(result: ReadResult): RowProblem[] {
	if (result.ok) throw new Error('expected the data to be refused');
	return result.problems;
}

describe('run data refused with the row and the reason, nothing stored', () => {
	let runId: string;
	beforeAll(() => {
		runId = newRun('Refusals');
	});

	const refusals: {
		name: string;
		csv: string;
		row: number;
		column: string | null;
		says: RegExp;
	}[] = [
		{
			name: 'a column in a unit not read',
			csv: 'time_h,do_ppm\n0,40\n',
			row: 0,
			column: 'do_ppm',
			says: /do_ppm.*do_percent/
		},
		{
			name: 'a column that is no signal',
			csv: 'time_h,colour\n0,4\n',
			row: 0,
			column: 'colour',
			says: /“colour” is not a signal.*do_percent/
		},
		{
			name: 'no time column',
			csv: 'do_percent,ph\n40,7\n',
			row: 0,
			column: null,
			says: /No time column/
		},
		{
			name: 'two time columns',
			csv: 'time_h,time_s,do_percent\n0,0,40\n',
			row: 0,
			column: null,
			says: /Only one time column.*time_h and time_s/
		},
		{
			name: 'a time earlier than the row before',
			csv: 'time_h,do_percent\n0,40\n1,39\n0.5,38\n',
			row: 3,
			column: 'time_h',
			says: /^Row 3: time 0.5 h is not after the row before \(1 h\)/
		},
		{
			name: 'a time equal to the row before',
			csv: 'time_h,do_percent\n0,40\n1,39\n1,38\n',
			row: 3,
			column: 'time_h',
			says: /^Row 3: .*not after the row before/
		},
		{
			name: 'a cell that is not a number',
			csv: 'time_h,do_percent\n0,40\n1,4o\n',
			row: 2,
			column: 'do_percent',
			says: /^Row 2, do_percent: “4o” is not a number/
		},
		{
			name: 'a decimal comma',
			csv: 'time_h;do_percent\n0;40\n1;39,5\n',
			row: 2,
			column: 'do_percent',
			says: /^Row 2, do_percent: “39,5” is not a number/
		},
		{
			name: 'DO at 150 % under air',
			csv: 'time_h,do_percent\n0,100\n1,150\n',
			row: 2,
			column: 'do_percent',
			says: /^Row 2, do_percent: 150 is outside 0–110 %/
		},
		{
			name: 'exhaust O2 and CO2 over 100 %',
			csv: 'time_h,exhaust_o2_percent,exhaust_co2_percent\n0,20,1\n1,90,20\n',
			row: 2,
			column: null,
			says: /^Row 2: exhaust O₂ and CO₂ add up to 110 %, above 100 %/
		},
		{
			name: 'an exhaust O2 typed as a fraction',
			csv: 'time_h,exhaust_o2_percent,exhaust_co2_percent\n0,19.5,1.3\n1,0.195,1.3\n',
			row: 2,
			column: null,
			says: /^Row 2: the inert gas share changes from 79.01 % at the inlet to 98.51 % in the exhaust, more than the 10 points/
		},
		{
			name: 'a timestamp without its zone',
			csv: 'timestamp,do_percent\n2026-03-02T09:00:00Z,40\n2026-03-02T10:00:00,39\n',
			row: 2,
			column: 'timestamp',
			says: /^Row 2: “2026-03-02T10:00:00” is not an ISO 8601 timestamp with its zone/
		}
	];

	for (const refusal of refusals)
		it(`refuses ${refusal.name}`, () => {
			const outcome = upload(runId, refusal.csv);
			expect(outcome.stored).toBeUndefined();
			const problem = outcome.problems!.find((p) => refusal.says.test(p.message));
			expect(problem, JSON.stringify(outcome.problems)).toBeDefined();
			expect(problem!.row).toBe(refusal.row);
			expect(problem!.column).toBe(refusal.column);
			expect(pointCount(runId)).toBe(0);
			expect(timeCount(runId)).toBe(0);
		});

	// Papa Parse renames a repeated header to “do_percent_1”: the refusal must name the column as written.
	it('refuses a column given twice, saying so', () => {
		const outcome = upload(runId, 'time_h,do_percent,do_percent\n0,40,41\n');
		expect(outcome.problems![0].message).toBe('Column “do_percent” is given twice.');
	});

	it('refuses the whole file for one bad row among good ones', () => {
		const rows = Array.from({ length: 50 }, (_, i) => `${i * 0.1},${i === 37 ? 'n/a' : 40}`);
		const outcome = upload(runId, ['time_h,do_percent', ...rows].join('\n'));
		expect(outcome.problems).toHaveLength(1);
		expect(outcome.problems![0].row).toBe(38);
		expect(pointCount(runId)).toBe(0);
	});

	it('takes DO at 150 % when the inlet gas is 40 % O2 (saturation with the gas in use)', () => {
		// Henry's law: C* rises with the O2 fraction, 110 % × 40/20.95 = 210 % of air saturation.
		const accepted = readRunCsv('time_h,inlet_o2_percent,do_percent\n0,40,150\n', STARTED_AT_MS);
		expect(accepted.ok).toBe(true);
		const refused = problemsOf(
			readRunCsv('time_h,inlet_o2_percent,do_percent\n0,40,215\n', STARTED_AT_MS)
		);
		expect(refused[0].message).toMatch(/215 is outside 0–210 %/);
	});
});

describe('storing run data', () => {
	let runId: string;
	const FIRST = [
		'time_h,do_percent,ph,temperature_c',
		'1,80,7.0,30',
		'2,70,,30.1',
		'3,60,6.9,30',
		'4,50,6.8,30.2'
	].join('\n');

	beforeAll(() => {
		runId = newRun('Storage');
	});

	it('stores each signal’s points and one row per time', () => {
		const { stored } = upload(runId, FIRST);
		// 4 DO + 3 pH (one blank) + 4 temperature
		expect(stored).toMatchObject({ inserted: 11, unchanged: 0, replaced: 0 });
		expect(stored!.signals).toEqual(['do_percent', 'ph', 'temperature_c']);
		expect(pointCount(runId)).toBe(11);
		expect(timeCount(runId)).toBe(4);
		const series = readSeries(runId);
		expect(series.do_percent).toEqual({
			timeS: [3600, 7200, 10800, 14400],
			value: [80, 70, 60, 50]
		});
		expect(series.ph).toEqual({ timeS: [3600, 10800, 14400], value: [7, 6.9, 6.8] });
	});

	it('leaves the same file sent again as it is', () => {
		const { stored } = upload(runId, FIRST);
		expect(stored).toMatchObject({ inserted: 0, unchanged: 11, replaced: 0 });
		expect(pointCount(runId)).toBe(11);
	});

	it('refuses another value at a stored time with 409, changing nothing, and replaces on request', async () => {
		const changed = FIRST.replace('3,60,6.9,30', '3,61,6.9,30').replace('4,50,', '4,49,');
		const refusal = await refusalOf(() => upload(runId, changed));
		expect(refusal.status).toBe(409);
		expect(refusal.message).toMatch(/^2 points are already stored with another value/);
		expect(refusal.message).toContain('DO (% of air saturation) at 3 h: stored 60, sent 61');
		expect(readSeries(runId).do_percent!.value).toEqual([80, 70, 60, 50]);
		expect(pointCount(runId)).toBe(11);

		const { stored } = upload(runId, changed, 'replace');
		expect(stored).toMatchObject({ inserted: 0, unchanged: 9, replaced: 2 });
		expect(readSeries(runId).do_percent!.value).toEqual([80, 70, 61, 49]);
		expect(pointCount(runId)).toBe(11);
	});

	it('merges a later upload of earlier times into place', () => {
		const { stored } = upload(
			runId,
			'time_min,do_percent,dry_weight_g_per_l\n15,95,0.2\n30,90,\n90,75,0.5\n'
		);
		// 15 and 30 min are before the first stored hour; 90 min falls between 1 h and 2 h
		expect(stored).toMatchObject({ inserted: 5, unchanged: 0, replaced: 0 });
		const series = readSeries(runId);
		expect(series.do_percent!.timeS).toEqual([900, 1800, 3600, 5400, 7200, 10800, 14400]);
		expect(series.do_percent!.value).toEqual([95, 90, 80, 75, 70, 61, 49]);
		expect(series.dry_weight_g_per_l).toEqual({ timeS: [900, 5400], value: [0.2, 0.5] });
		expect(timeCount(runId)).toBe(7);
	});

	it('reads timestamps with their zone as seconds since the start', () => {
		const read = readRunCsv(
			'timestamp,ph\n2026-03-02T09:00:00+01:00,7\n2026-03-02 08:30:00Z,7.1\n',
			STARTED_AT_MS
		);
		if (!read.ok) throw new Error(JSON.stringify(read.problems));
		// 09:00+01:00 is 08:00 UTC, the start; 08:30Z is half an hour in
		expect(read.batch.series.get('ph')!.timeS).toEqual([0, 1800]);
	});

	it('pages the table, one row per time with every signal read then', () => {
		const first = readDataPage(runId, 1, 3);
		expect(first.total).toBe(7);
		expect(first.signals.sort()).toEqual(
			['do_percent', 'dry_weight_g_per_l', 'ph', 'temperature_c'].sort()
		);
		expect(first.rows.map((r) => r.timeS)).toEqual([900, 1800, 3600]);
		expect(first.rows[0].values).toEqual({ do_percent: 95, dry_weight_g_per_l: 0.2 });
		expect(first.rows[2].values).toEqual({ do_percent: 80, ph: 7, temperature_c: 30 });
		const last = readDataPage(runId, 3, 3);
		expect(last.rows).toEqual([
			{ timeS: 14400, values: { do_percent: 49, ph: 6.8, temperature_c: 30.2 } }
		]);
		expect(readDataPage(runId, 4, 3).rows).toEqual([]);
	});
});

describe('API points', () => {
	it('refuses points out of order, naming the point by its index', () => {
		const problems = problemsOf(
			readPointObjects(
				[
					{ time_h: 0, do_percent: 50 },
					{ time_h: 1, do_percent: 45 },
					{ time_h: 0.5, do_percent: 40 }
				],
				STARTED_AT_MS
			)
		);
		expect(problems).toHaveLength(1);
		expect(problems[0].row).toBe(2);
		expect(problems[0].message).toMatch(
			/^Point 2: time 0.5 h is not after the point before \(1 h\)/
		);
	});

	it('reads points whose keys differ from point to point', () => {
		const read = readPointObjects(
			[
				{ time_s: 0, do_percent: 50 },
				{ time_s: 60, ph: 7.1 }
			],
			STARTED_AT_MS
		);
		if (!read.ok) throw new Error(JSON.stringify(read.problems));
		expect(read.batch.series.get('do_percent')).toEqual({ timeS: [0], value: [50] });
		expect(read.batch.series.get('ph')).toEqual({ timeS: [60], value: [7.1] });
		expect([read.batch.firstS, read.batch.lastS]).toEqual([0, 60]);
	});
});

describe('chart series', () => {
	let runId: string;
	// a slow wave with one spike and one dip well inside buckets, one point every 10 s
	const rows = Array.from({ length: 5000 }, (_, i) => ({
		time_s: i * 10,
		do_percent: i === 1234 ? 104.5 : i === 3777 ? 0.5 : 50 + 20 * Math.sin(i / 300)
	}));
	beforeAll(() => {
		runId = newRun('Chart');
		const read = readRows(['time_s', 'do_percent'], rows, STARTED_AT_MS);
		if (!read.ok) throw new Error(JSON.stringify(read.problems));
		storePoints(actor, runId, read.batch, { source: 'api' });
	});

	it('thins 5,000 points to about two per bucket, keeping the highest and the lowest', () => {
		for (const buckets of [100, 600]) {
			const chart = readChartSeries(runId, buckets).do_percent!;
			expect(chart.timeS.length).toBeGreaterThan(buckets);
			expect(chart.timeS.length).toBeLessThan(5000);
			expect(Math.max(...chart.value)).toBe(104.5);
			expect(Math.min(...chart.value)).toBe(0.5);
			expect(chart.timeS[chart.value.indexOf(104.5)]).toBe(12340);
			expect(chart.timeS[chart.value.indexOf(0.5)]).toBe(37770);
			// in time order, each value the one stored at its time
			for (let i = 1; i < chart.timeS.length; i++)
				expect(chart.timeS[i]).toBeGreaterThan(chart.timeS[i - 1]);
			for (const k of [0, 17, chart.timeS.length - 1])
				expect(chart.value[k]).toBe(rows[chart.timeS[k] / 10].do_percent);
		}
		// the whole series is still there for the calculations
		expect(readSeries(runId).do_percent!.timeS).toHaveLength(5000);
	});

	// The last point, at (last − first)/width = buckets exactly, belongs to the last bucket, not a
	// bucket of its own: 100 buckets give at most 200 points.
	it('gives at most two points per bucket', () => {
		expect(readChartSeries(runId, 100).do_percent!.timeS.length).toBeLessThanOrEqual(200);
	});

	it('returns a short series as it is', () => {
		const shortRunId = newRun('Short chart');
		const read = readRunCsv('time_h,ph\n0,7\n1,6.9\n2,6.8\n', STARTED_AT_MS);
		if (!read.ok) throw new Error(JSON.stringify(read.problems));
		storePoints(actor, shortRunId, read.batch, { source: 'csv' });
		expect(readChartSeries(shortRunId, 100).ph).toEqual({
			timeS: [0, 3600, 7200],
			value: [7, 6.9, 6.8]
		});
	});
});
