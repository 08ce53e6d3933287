// Reads run data (a CSV file, or the points of an API request) into series per signal, checking
// every row first: nothing is stored unless the whole of it is valid.
import Papa from 'papaparse';
import { MAX_INERT_FRACTION_CHANGE, MAX_PERCENT_SATURATION } from '$chemistry';
import {
	AIR_O2_PERCENT,
	RUN_SIGNALS,
	RUN_SIGNAL_NAMES,
	TIME_COLUMNS,
	isRunSignal,
	type RunSignal,
	type TimeColumn
} from '$lib/runs/signals';

/** A refusal at a row (1 = the first data row; the header is row 0) and, where known, a column. */
export interface RowProblem {
	row: number | null;
	column: string | null;
	message: string;
}

export interface SeriesPoints {
	timeS: number[];
	value: number[];
}

export interface PointBatch {
	rowCount: number;
	series: Map<RunSignal, SeriesPoints>;
	firstS: number | null;
	lastS: number | null;
}

export type ReadResult = { ok: true; batch: PointBatch } | { ok: false; problems: RowProblem[] };

/** 14 days at one row per second and then some; larger files are split by whoever sends them. */
export const MAX_ROWS = 1_500_000;
/** Problems listed before the reader stops looking: enough to see a pattern, not a wall of text. */
const MAX_PROBLEMS = 25;
const CO2_IN_AIR_PERCENT = 0.04;

const TIME_COLUMN_NAMES = Object.keys(TIME_COLUMNS) as TimeColumn[];

/** What a column that is not a signal probably meant, for the refusal. */
function guessColumn(name: string): string {
	const stem = name.split('_')[0];
	const same = RUN_SIGNAL_NAMES.filter((s) => s.split('_')[0] === stem);
	if (same.length)
		return `Column “${name}” has a unit this product does not read; use ${same.map((s) => `“${s}”`).join(' or ')}.`;
	return `Column “${name}” is not a signal this product reads. The columns are a time column (${TIME_COLUMN_NAMES.join(', ')}) and any of: ${RUN_SIGNAL_NAMES.join(', ')}.`;
}

interface Header {
	timeColumn: TimeColumn;
	signals: RunSignal[];
}

function readHeader(columns: string[]): { header: Header } | { problems: RowProblem[] } {
	const problems: RowProblem[] = [];
	const names = columns.map((c) => c.trim());
	const times = names.filter((n): n is TimeColumn => Object.hasOwn(TIME_COLUMNS, n));
	if (times.length !== 1)
		problems.push({
			row: 0,
			column: null,
			message:
				times.length === 0
					? `No time column: name one column ${TIME_COLUMN_NAMES.join(', ')} (elapsed since the run started, or an ISO 8601 timestamp with its zone).`
					: `Only one time column may be given; found ${times.join(' and ')}.`
		});
	const seen = new Set<string>();
	const signals: RunSignal[] = [];
	for (const name of names) {
		if (Object.hasOwn(TIME_COLUMNS, name)) continue;
		if (name === '') {
			problems.push({ row: 0, column: null, message: 'A column has no name.' });
			continue;
		}
		if (seen.has(name)) {
			problems.push({ row: 0, column: name, message: `Column “${name}” is given twice.` });
			continue;
		}
		seen.add(name);
		if (isRunSignal(name)) signals.push(name);
		else problems.push({ row: 0, column: name, message: guessColumn(name) });
	}
	if (!signals.length && !problems.length)
		problems.push({ row: 0, column: null, message: 'The file has a time column but no signal.' });
	return problems.length ? { problems } : { header: { timeColumn: times[0], signals } };
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

function readNumber(raw: unknown): number | null | 'bad' {
	if (raw === null || raw === undefined) return null;
	if (typeof raw === 'number') return Number.isFinite(raw) ? raw : 'bad';
	if (typeof raw !== 'string') return 'bad';
	const text = raw.trim();
	if (text === '') return null;
	return NUMBER.test(text) ? Number(text) : 'bad';
}

/** Seconds since the run started, from an elapsed time or an ISO 8601 timestamp with its zone. */
function readTime(raw: unknown, column: TimeColumn, startedAtMs: number): number | string {
	if (column === 'timestamp') {
		const text = typeof raw === 'string' ? raw.trim() : '';
		if (!/^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})$/.test(text))
			return `“${String(raw ?? '')}” is not an ISO 8601 timestamp with its zone (2026-03-02T14:05:00Z or …+01:00).`;
		const ms = Date.parse(text.replace(' ', 'T'));
		if (Number.isNaN(ms)) return `“${text}” is not a date and time.`;
		return (ms - startedAtMs) / 1000;
	}
	const value = readNumber(raw);
	if (value === null) return 'the time is missing.';
	if (value === 'bad') return `“${String(raw)}” is not a number.`;
	return value * TIME_COLUMNS[column];
}

const TIME_UNIT_WORDS: Record<TimeColumn, string> = {
	time_s: 's',
	time_min: 'min',
	time_h: 'h',
	timestamp: 'h after the start'
};

/** A time as the file wrote it: in its own column's unit. */
function formatTime(seconds: number, column: TimeColumn): string {
	const perUnit = TIME_COLUMNS[column] ?? 3600;
	return `${Number((seconds / perUnit).toPrecision(10))} ${TIME_UNIT_WORDS[column]}`;
}

/**
 * The DO a row may read: saturation with the gas in use. A probe calibrated to 100 % in air reads
 * proportionally more under O2-enriched inlet gas (Henry's law), plus the calibration allowance.
 */
function maxDissolvedOxygenPercent(inletO2Percent: number | undefined): number {
	const enrichment =
		inletO2Percent !== undefined ? Math.max(1, inletO2Percent / AIR_O2_PERCENT) : 1;
	return MAX_PERCENT_SATURATION * enrichment;
}

/** Gas percentages that cannot be: a stream over 100 %, or an inert share that changes past the balance's bound. */
function gasProblems(values: Partial<Record<RunSignal, number>>): string[] {
	const problems: string[] = [];
	const inO2 = values.inlet_o2_percent;
	const inCo2 = values.inlet_co2_percent;
	const outO2 = values.exhaust_o2_percent;
	const outCo2 = values.exhaust_co2_percent;
	if (inO2 !== undefined && inCo2 !== undefined && inO2 + inCo2 > 100)
		problems.push(`inlet O₂ and CO₂ add up to ${inO2 + inCo2} %, above 100 %.`);
	if (outO2 !== undefined && outCo2 !== undefined) {
		if (outO2 + outCo2 > 100)
			problems.push(`exhaust O₂ and CO₂ add up to ${outO2 + outCo2} %, above 100 %.`);
		else {
			const inertIn = 100 - (inO2 ?? AIR_O2_PERCENT) - (inCo2 ?? CO2_IN_AIR_PERCENT);
			const inertOut = 100 - outO2 - outCo2;
			const changePoints = Math.abs(inertOut - inertIn);
			if (changePoints > MAX_INERT_FRACTION_CHANGE * 100)
				problems.push(
					`the inert gas share changes from ${Number(inertIn.toFixed(2))} % at the inlet to ${Number(inertOut.toFixed(2))} % in the exhaust, more than the ${MAX_INERT_FRACTION_CHANGE * 100} points a culture can cause; check the analyser's units (percent, not fraction) and its calibration.`
				);
		}
	}
	return problems;
}

/** Reads rows (objects keyed by column) already split from a file or a request. */
export function readRows(
	columns: string[],
	rows: readonly Record<string, unknown>[],
	startedAtMs: number,
	rowOffset = 1
): ReadResult {
	const head = readHeader(columns);
	if ('problems' in head) return { ok: false, problems: head.problems };
	const { timeColumn, signals } = head.header;
	if (rows.length === 0)
		return { ok: false, problems: [{ row: null, column: null, message: 'There are no rows.' }] };
	if (rows.length > MAX_ROWS)
		return {
			ok: false,
			problems: [
				{
					row: null,
					column: null,
					message: `${rows.length} rows is more than the ${MAX_ROWS} one upload takes; split the file by time.`
				}
			]
		};
	const problems: RowProblem[] = [];
	const add = (problem: RowProblem) => {
		if (problems.length < MAX_PROBLEMS) problems.push(problem);
	};
	const series = new Map<RunSignal, SeriesPoints>(
		signals.map((s) => [s, { timeS: [], value: [] }])
	);
	let previousS: number | null = null;
	for (let i = 0; i < rows.length && problems.length < MAX_PROBLEMS; i++) {
		const row = rows[i];
		const rowNumber = i + rowOffset;
		const time = readTime(row[timeColumn], timeColumn, startedAtMs);
		if (typeof time === 'string') {
			add({ row: rowNumber, column: timeColumn, message: `Row ${rowNumber}: ${time}` });
			continue;
		}
		if (previousS !== null && time <= previousS) {
			add({
				row: rowNumber,
				column: timeColumn,
				message: `Row ${rowNumber}: time ${formatTime(time, timeColumn)} is not after the row before (${formatTime(previousS, timeColumn)}); times must rise from row to row.`
			});
		}
		previousS = time;
		const values: Partial<Record<RunSignal, number>> = {};
		for (const signal of signals) {
			const value = readNumber(row[signal]);
			if (value === null) continue;
			if (value === 'bad') {
				add({
					row: rowNumber,
					column: signal,
					message: `Row ${rowNumber}, ${signal}: “${String(row[signal])}” is not a number (write decimals with a point).`
				});
				continue;
			}
			values[signal] = value;
		}
		for (const [signal, value] of Object.entries(values) as [RunSignal, number][]) {
			const definition = RUN_SIGNALS[signal];
			const max =
				signal === 'do_percent'
					? maxDissolvedOxygenPercent(values.inlet_o2_percent)
					: definition.max;
			if (value < definition.min || value > max) {
				add({
					row: rowNumber,
					column: signal,
					message: `Row ${rowNumber}, ${signal}: ${value} is outside ${definition.min}–${Number(max.toFixed(1))}${definition.unit.startsWith('%') ? ' %' : definition.unit ? ` ${definition.unit}` : ''} (${definition.bounds}).`
				});
				continue;
			}
			const points = series.get(signal)!;
			points.timeS.push(time);
			points.value.push(value);
		}
		for (const message of gasProblems(values))
			add({ row: rowNumber, column: null, message: `Row ${rowNumber}: ${message}` });
	}
	if (problems.length) return { ok: false, problems };
	for (const [signal, points] of series) if (points.timeS.length === 0) series.delete(signal);
	const allTimes = [...series.values()].flatMap((p) => [p.timeS[0], p.timeS[p.timeS.length - 1]]);
	return {
		ok: true,
		batch: {
			rowCount: rows.length,
			series,
			firstS: allTimes.length ? Math.min(...allTimes) : null,
			lastS: allTimes.length ? Math.max(...allTimes) : null
		}
	};
}

/** A CSV file: a header row naming the columns, then one row per time. */
export function readRunCsv(text: string, startedAtMs: number): ReadResult {
	const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), {
		header: true,
		skipEmptyLines: 'greedy'
	});
	const broken = parsed.errors.find((e) => e.type !== 'Delimiter');
	if (broken)
		return {
			ok: false,
			problems: [
				{
					row: broken.row === undefined ? null : broken.row + 1,
					column: null,
					message: `${broken.row === undefined ? 'The file' : `Row ${broken.row + 1}`}: ${broken.message}.`
				}
			]
		};
	// Papa Parse renames a repeated column (do_percent, do_percent_1); the header as written says which.
	const written = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { preview: 1 }).data[0] ?? [];
	const twice = written.map((c) => c.trim()).filter((c, i, all) => c && all.indexOf(c) !== i);
	if (twice.length)
		return {
			ok: false,
			problems: [...new Set(twice)].map((name) => ({
				row: 0,
				column: name,
				message: `Column “${name}” is given twice.`
			}))
		};
	return readRows(parsed.meta.fields ?? [], parsed.data, startedAtMs);
}

/** The points of an API request: objects keyed like the CSV columns, in rising time. */
export function readPointObjects(
	points: readonly Record<string, unknown>[],
	startedAtMs: number
): ReadResult {
	const columns = [...new Set(points.flatMap((p) => Object.keys(p)))];
	const result = readRows(columns, points, startedAtMs, 0);
	if (result.ok) return result;
	// API points are counted from 0, as their array index: say "point" rather than "row".
	return {
		ok: false,
		problems: result.problems.map((p) => ({
			...p,
			// a problem with the keys is no point's fault: it must not read as point 0's
			row: p.row === 0 && !p.message.startsWith('Row') ? null : p.row,
			message: p.message
				.replace(/^Row (\d+)/, 'Point $1')
				.replace('the row before', 'the point before')
				.replace('from row to row', 'from point to point')
		}))
	};
}
