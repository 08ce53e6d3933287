// Stores a checked batch of run data. The rule for points that are already there:
// - the same value at the same time of the same signal: left as it is (a resend is harmless);
// - another value there: the whole batch is refused, naming the first clashes, unless the sender
//   asks to replace (`onConflict: 'replace'`), which is audited with the count replaced;
// - points earlier than what is stored (a late offline sample, a controller catching up) are merged
//   into place. Order within one batch must rise (read-points.ts refuses it otherwise).
import { recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { runUpload } from '../db/schema';
import { RuleError } from '../rule-error';
import { signalTitle, type RunSignal } from '$lib/runs/signals';
import type { PointBatch } from './read-points';

export const CONFLICT_RULES = ['refuse', 'replace'] as const;
export type ConflictRule = (typeof CONFLICT_RULES)[number];

export interface StoreOutcome {
	uploadId: string;
	inserted: number;
	unchanged: number;
	replaced: number;
	signals: RunSignal[];
}

const sameValue = (a: number, b: number) =>
	Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));

const formatTime = (s: number) => `${Number((s / 3600).toFixed(4))} h`;

/**
 * Written with the driver's prepared statements rather than the query builder: one statement bound
 * a million times (a 14-day run) is many times faster than building a query per point.
 */
export function storePoints(
	actor: Actor & { id: string },
	runId: string,
	batch: PointBatch,
	options: { source: 'csv' | 'api'; fileName?: string | null; onConflict?: ConflictRule }
): StoreOutcome {
	const client = db.$client;
	const findSeries = client.prepare('SELECT key FROM run_series WHERE run_id = ? AND signal = ?');
	const addSeries = client.prepare('INSERT INTO run_series (run_id, signal) VALUES (?, ?)');
	const existingIn = client.prepare(
		'SELECT time_s AS t, value AS v FROM run_point WHERE series_key = ? AND time_s BETWEEN ? AND ?'
	);
	const insertPoint = client.prepare(
		'INSERT INTO run_point (series_key, time_s, value) VALUES (?, ?, ?)'
	);
	const replacePoint = client.prepare(
		'UPDATE run_point SET value = ? WHERE series_key = ? AND time_s = ?'
	);
	const insertTime = client.prepare(
		'INSERT OR IGNORE INTO run_time (run_id, time_s) VALUES (?, ?)'
	);
	const replace = options.onConflict === 'replace';

	return db.transaction((tx) => {
		let inserted = 0;
		let unchanged = 0;
		let replaced = 0;
		const clashes: string[] = [];
		let clashCount = 0;
		const times = new Set<number>();
		for (const [signal, points] of batch.series) {
			let key = (findSeries.get(runId, signal) as { key: number } | undefined)?.key;
			if (key === undefined) key = Number(addSeries.run(runId, signal).lastInsertRowid);
			const first = points.timeS[0];
			const last = points.timeS[points.timeS.length - 1];
			const stored = new Map<number, number>();
			for (const row of existingIn.iterate(key, first, last) as Iterable<{ t: number; v: number }>)
				stored.set(row.t, row.v);
			for (let i = 0; i < points.timeS.length; i++) {
				const t = points.timeS[i];
				const v = points.value[i];
				const before = stored.get(t);
				if (before === undefined) {
					insertPoint.run(key, t, v);
					inserted++;
					times.add(t);
				} else if (sameValue(before, v)) {
					unchanged++;
				} else if (replace) {
					replacePoint.run(v, key, t);
					replaced++;
				} else {
					clashCount++;
					if (clashes.length < 5)
						clashes.push(`${signalTitle(signal)} at ${formatTime(t)}: stored ${before}, sent ${v}`);
				}
			}
		}
		if (clashCount)
			throw new RuleError(
				`${clashCount} point${clashCount === 1 ? ' is' : 's are'} already stored with another value (${clashes.join('; ')}${clashCount > clashes.length ? '; …' : ''}). Nothing was stored. Send them again with “replace” to overwrite, or leave them out.`,
				{ status: 409, field: 'points' }
			);
		for (const t of times) insertTime.run(runId, t);
		const uploadId = crypto.randomUUID();
		const signals = [...batch.series.keys()];
		tx.insert(runUpload)
			.values({
				id: uploadId,
				runId,
				source: options.source,
				fileName: options.fileName ?? null,
				rowCount: batch.rowCount,
				pointCount: inserted,
				unchangedCount: unchanged,
				replacedCount: replaced,
				signals,
				firstS: batch.firstS,
				lastS: batch.lastS,
				createdById: actor.id
			})
			.run();
		recordAudit(
			actor,
			{
				action: 'run.data_added',
				subjectType: 'run',
				subjectId: runId,
				detail: {
					source: options.source,
					fileName: options.fileName ?? null,
					rows: batch.rowCount,
					inserted,
					unchanged,
					replaced,
					signals
				}
			},
			tx
		);
		return { uploadId, inserted, unchanged, replaced, signals };
	});
}
