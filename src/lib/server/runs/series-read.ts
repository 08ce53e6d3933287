// Reading a run's stored data: whole series for the calculations, a few thousand points per signal
// for the charts, and pages of rows for the table.
import { RUN_SIGNAL_NAMES, isRunSignal, type RunSignal } from '$lib/runs/signals';
import { db } from '../db';
import type { SeriesPoints } from './read-points';

export type RunSeries = Partial<Record<RunSignal, SeriesPoints>>;

function seriesKeys(runId: string): Map<RunSignal, number> {
	const rows = db.$client
		.prepare('SELECT key, signal FROM run_series WHERE run_id = ?')
		.all(runId) as { key: number; signal: string }[];
	// in the signals' own order (DO, pH, temperature …), whatever order they were first stored in
	return new Map(
		rows
			.filter((r) => isRunSignal(r.signal))
			.sort(
				(a, b) =>
					RUN_SIGNAL_NAMES.indexOf(a.signal as RunSignal) -
					RUN_SIGNAL_NAMES.indexOf(b.signal as RunSignal)
			)
			.map((r) => [r.signal as RunSignal, r.key])
	);
}

/** Every point of the named signals (all when none are named), in time order. */
export function readSeries(runId: string, signals?: readonly RunSignal[]): RunSeries {
	const statement = db.$client
		.prepare('SELECT time_s, value FROM run_point WHERE series_key = ? ORDER BY time_s')
		.raw(true);
	const result: RunSeries = {};
	for (const [signal, key] of seriesKeys(runId)) {
		if (signals && !signals.includes(signal)) continue;
		const timeS: number[] = [];
		const value: number[] = [];
		for (const [t, v] of statement.iterate(key) as Iterable<[number, number]>) {
			timeS.push(t);
			value.push(v);
		}
		result[signal] = { timeS, value };
	}
	return result;
}

/** Points per signal a chart gets: two per bucket (the lowest and highest), about 2 per pixel. */
export const CHART_BUCKETS = 600;

/**
 * The series thinned for a chart: the time span cut into buckets, and from each the lowest and the
 * highest reading, in time order, so a spike or a dip stays visible. Done in SQL (SQLite's MIN/MAX
 * with a bare column returns the row holding the extreme) so a 120,000-point series never leaves
 * the database whole; a series with fewer points than two per bucket comes back as it is.
 */
export function readChartSeries(runId: string, buckets = CHART_BUCKETS): RunSeries {
	const client = db.$client;
	const span = client.prepare(
		'SELECT count(*) AS n, min(time_s) AS first, max(time_s) AS last FROM run_point WHERE series_key = ?'
	);
	const all = client
		.prepare('SELECT time_s, value FROM run_point WHERE series_key = ? ORDER BY time_s')
		.raw(true);
	const extreme = (which: 'min' | 'max') =>
		client
			.prepare(
				// the last point falls exactly on the edge of bucket n: it belongs to the last bucket
				`SELECT time_s, ${which}(value) FROM run_point WHERE series_key = ?
				 GROUP BY min(cast((time_s - ?) / ? AS integer), ?)`
			)
			.raw(true);
	const lows = extreme('min');
	const highs = extreme('max');
	const result: RunSeries = {};
	for (const [signal, key] of seriesKeys(runId)) {
		const { n, first, last } = span.get(key) as { n: number; first: number; last: number };
		const timeS: number[] = [];
		const value: number[] = [];
		if (n <= buckets * 2 || last <= first) {
			for (const [t, v] of all.iterate(key) as Iterable<[number, number]>) {
				timeS.push(t);
				value.push(v);
			}
		} else {
			const width = (last - first) / buckets;
			const picked = new Map<number, number>();
			for (const statement of [lows, highs])
				for (const [t, v] of statement.iterate(key, first, width, buckets - 1) as Iterable<
					[number, number]
				>)
					picked.set(t, v);
			for (const t of [...picked.keys()].sort((a, b) => a - b)) {
				timeS.push(t);
				value.push(picked.get(t)!);
			}
		}
		result[signal] = { timeS, value };
	}
	return result;
}

export interface DataPage {
	total: number;
	signals: RunSignal[];
	rows: { timeS: number; values: Partial<Record<RunSignal, number>> }[];
}

/** One page of the data table: a row per time any signal was read, in time order. */
export function readDataPage(runId: string, page: number, limit: number): DataPage {
	const client = db.$client;
	const keys = seriesKeys(runId);
	const { total } = client
		.prepare('SELECT count(*) AS total FROM run_time WHERE run_id = ?')
		.get(runId) as { total: number };
	const times = (
		client
			.prepare('SELECT time_s FROM run_time WHERE run_id = ? ORDER BY time_s LIMIT ? OFFSET ?')
			.raw(true)
			.all(runId, limit, (page - 1) * limit) as [number][]
	).map(([t]) => t);
	const rows = times.map((timeS) => ({ timeS, values: {} as Partial<Record<RunSignal, number>> }));
	if (times.length) {
		const byTime = new Map(rows.map((r) => [r.timeS, r]));
		const inRange = client
			.prepare(
				'SELECT time_s, value FROM run_point WHERE series_key = ? AND time_s BETWEEN ? AND ?'
			)
			.raw(true);
		for (const [signal, key] of keys)
			for (const [t, v] of inRange.iterate(key, times[0], times[times.length - 1]) as Iterable<
				[number, number]
			>) {
				const row = byTime.get(t);
				if (row) row.values[signal] = v;
			}
	}
	return { total, signals: [...keys.keys()], rows };
}
