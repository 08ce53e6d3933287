// Data into and out of a run over HTTP: the API's JSON points or a CSV file, and the CSV export.
import { eq } from 'drizzle-orm';
import Papa from 'papaparse';
import { zodProblems } from '$lib/field-problems';
import { RUN_SIGNAL_NAMES } from '$lib/runs/signals';
import { ApiProblem } from '../api/endpoint';
import { runDataRequest } from '../api/operations/runs';
import type { Actor } from '../audit';
import { db } from '../db';
import { run, type RunRow } from '../db/schema';
import { RuleError } from '../rule-error';
import { readPointObjects, readRunCsv, type ReadResult, type RowProblem } from './read-points';
import { readSeries } from './series-read';
import { storePoints, type ConflictRule } from './store-points';

/** 14 days at one row per 10 s with every signal is about 12 MB of CSV; this leaves room. */
export const MAX_UPLOAD_BYTES = 40_000_000;

export function findRun(id: string): RunRow {
	const found = db.select().from(run).where(eq(run.id, id)).get();
	if (!found) throw new RuleError('No such run.', { status: 404 });
	return found;
}

function refusal(problems: RowProblem[], unit: 'rows' | 'points'): ApiProblem {
	const errors = problems.map((p) => ({
		// a header or key problem names the column at the collection's level: points.do_ppm
		path:
			p.row === null
				? `${unit}${p.column ? `.${p.column}` : ''}`
				: `${unit}.${p.row}${p.column ? `.${p.column}` : ''}`,
		message: p.message
	}));
	return new ApiProblem(
		422,
		`Nothing was stored: ${problems.length === 1 ? 'one problem' : `${problems.length}${problems.length >= 25 ? ' or more' : ''} problems`}. ${problems
			.slice(0, 5)
			.map((p) => p.message)
			.join(' ')}`,
		errors
	);
}

/** Reads the body as CSV (text/csv) or JSON points, checks all of it, then stores it. */
export async function addRunData(
	actor: Actor & { id: string },
	runId: string,
	request: Request,
	url: URL
) {
	const found = findRun(runId);
	const type = (request.headers.get('content-type') ?? '').toLowerCase();
	const text = await request.text();
	if (text.length > MAX_UPLOAD_BYTES)
		throw new ApiProblem(
			413,
			`The body is larger than ${MAX_UPLOAD_BYTES} bytes; split it by time.`
		);
	const startedAtMs = found.startedAt.getTime();
	let read: ReadResult;
	let onConflict: ConflictRule = 'refuse';
	let fileName: string | null = null;
	if (type.startsWith('text/csv')) {
		const rule = url.searchParams.get('onConflict') ?? 'refuse';
		if (rule !== 'refuse' && rule !== 'replace')
			throw new ApiProblem(400, 'onConflict is refuse or replace.', [
				{ path: 'onConflict', message: 'refuse or replace' }
			]);
		onConflict = rule;
		fileName = url.searchParams.get('fileName')?.slice(0, 200) ?? null;
		read = readRunCsv(text, startedAtMs);
		if (!read.ok) throw refusal(read.problems, 'rows');
	} else if (/^application\/([\w.+-]+\+)?json/.test(type)) {
		let raw: unknown;
		try {
			raw = JSON.parse(text);
		} catch (cause) {
			throw new ApiProblem(400, `The body is not valid JSON: ${(cause as Error).message}`);
		}
		const parsed = runDataRequest.safeParse(raw);
		if (!parsed.success) {
			const errors = zodProblems(parsed.error.issues);
			throw new ApiProblem(400, errors.map((e) => `${e.path}: ${e.message}`).join('; '), errors);
		}
		onConflict = parsed.data.onConflict;
		read = readPointObjects(parsed.data.points, startedAtMs);
		if (!read.ok) throw refusal(read.problems, 'points');
	} else {
		throw new ApiProblem(
			415,
			'Send the data as JSON (application/json) or as a CSV file (text/csv).'
		);
	}
	return storePoints(actor, found.id, read.batch, {
		source: type.startsWith('text/csv') ? 'csv' : 'api',
		fileName,
		onConflict
	});
}

/** Every stored point, one row per time, in the upload's own columns (time_s, then each signal). */
export function runDataCsv(runId: string): string {
	const series = readSeries(runId);
	const signals = RUN_SIGNAL_NAMES.filter((s) => series[s]);
	const rows = new Map<number, (number | '')[]>();
	signals.forEach((signal, column) => {
		const s = series[signal]!;
		for (let i = 0; i < s.timeS.length; i++) {
			let row = rows.get(s.timeS[i]);
			if (!row) {
				row = signals.map(() => '' as const);
				rows.set(s.timeS[i], row);
			}
			row[column] = s.value[i];
		}
	});
	const times = [...rows.keys()].sort((a, b) => a - b);
	return Papa.unparse({
		fields: ['time_s', ...signals],
		data: times.map((t) => [t, ...rows.get(t)!])
	});
}
