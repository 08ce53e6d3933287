import { and, eq, sql } from 'drizzle-orm';
import { BATCH_STATE_LABELS } from '$lib/batches';
import { recordAudit, type Actor } from '../audit';
import { db, type Db } from '../db';
import { batch, batchLine, type Batch, type BatchLine } from '../db/schema';
import { RuleError } from '../rule-error';

export type Reader = Pick<Db, 'select'>;
export type Technician = Actor & { id: string; email: string };

export function findBatch(id: string, reader: Reader = db): Batch | undefined {
	return reader.select().from(batch).where(eq(batch.id, id)).get();
}

export function requireBatch(id: string, reader: Reader = db): Batch {
	const found = findBatch(id, reader);
	if (!found) throw new RuleError('No batch with this id.', { status: 404 });
	return found;
}

export function requireOpen(b: Batch): void {
	if (b.state !== 'planned' && b.state !== 'in_preparation') {
		throw new RuleError(
			`Batch ${b.number} is ${BATCH_STATE_LABELS[b.state].toLowerCase()}; its record is closed.`,
			{ status: 409 }
		);
	}
}

export function requireLine(b: Batch, lineId: string, reader: Reader): BatchLine {
	const line = reader
		.select()
		.from(batchLine)
		.where(and(eq(batchLine.id, lineId), eq(batchLine.batchId, b.id)))
		.get();
	if (!line) throw new RuleError('No such line on this batch.', { status: 404 });
	return line;
}

/** planned → in preparation, the first time a technician works on it. */
export function markStarted(tx: Pick<Db, 'update'>, actor: Technician, b: Batch): void {
	if (b.state !== 'planned') return;
	tx.update(batch)
		.set({ state: 'in_preparation', startedAt: new Date() })
		.where(eq(batch.id, b.id))
		.run();
	recordAudit(
		actor,
		{
			action: 'batch.started',
			subjectType: 'batch',
			subjectId: b.id,
			detail: { number: b.number }
		},
		tx as Db
	);
}

export function startPreparation(actor: Technician, batchId: string): void {
	db.transaction((tx) => {
		const b = requireBatch(batchId, tx);
		requireOpen(b);
		markStarted(tx, actor, b);
	});
}

/** A batch from what the sheet's QR code or a typed entry gives: the record URL, its id, or the batch number. */
export function batchFromScan(text: string, reader: Reader = db): Batch | undefined {
	const trimmed = text.trim();
	if (!trimmed) return undefined;
	const candidates = [trimmed];
	try {
		const url = new URL(trimmed);
		const match = /\/batches\/([^/?#]+)/.exec(url.pathname);
		if (match) candidates.unshift(decodeURIComponent(match[1]));
	} catch {
		// not a URL
	}
	for (const candidate of candidates) {
		const found =
			findBatch(candidate, reader) ??
			reader
				.select()
				.from(batch)
				.where(sql`upper(${batch.number}) = upper(${candidate})`)
				.get();
		if (found) return found;
	}
	return undefined;
}
