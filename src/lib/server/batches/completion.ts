import { and, eq, isNull } from 'drizzle-orm';
import { BATCH_STATE_LABELS, COMPLETION_MEANING } from '$lib/batches';
import { isoToday, isUsableLot } from '$lib/inventory';
import { convertMass } from '$lib/quantities';
import { recordAudit } from '../audit';
import { findComponent } from '../components/library';
import { db } from '../db';
import { batch, batchLine, type Batch, type BatchLine, type Lot } from '../db/schema';
import { appendStockEntry, type Tx } from '../inventory/ledger';
import { findLot } from '../inventory/lots';
import { massToLotQuantity } from '../inventory/units';
import { findVersionById } from '../recipes/queries';
import { RuleError } from '../rule-error';
import { componentsOfVersion } from '../recipes/snapshot';
import { digestOf, signRecord } from '../signatures';
import { requireBatch, type Reader, type Technician } from './execution';

/** What a completion signature is tied to: every line with its lot and actual quantity. */
export function batchDigest(b: Batch, reader: Reader = db): string {
	const lines = reader.select().from(batchLine).where(eq(batchLine.batchId, b.id)).all();
	return digestOf({
		number: b.number,
		versionId: b.versionId,
		volumeMl: b.targetVolumeMl,
		ph: b.measuredPh,
		osmolality: b.measuredOsmolality,
		lines: lines
			.sort((x, y) => x.position - y.position)
			.map((l) => [l.position, l.lotId, l.actualUg ?? l.actualUl, l.stockSource])
	});
}

/** Why the batch cannot be completed yet, or null. */
export function completionProblem(b: Batch, reader: Reader = db): string | null {
	if (b.state !== 'in_preparation')
		return b.state === 'planned'
			? 'Nothing has been recorded on this batch yet.'
			: `Batch ${b.number} is ${BATCH_STATE_LABELS[b.state].toLowerCase()}.`;
	const open = reader
		.select()
		.from(batchLine)
		.where(and(eq(batchLine.batchId, b.id), isNull(batchLine.doneAt)))
		.all();
	if (open.length)
		return `Lines ${open
			.map((l) => l.position)
			.sort((x, y) => x - y)
			.join(', ')} are not signed as done yet.`;
	const version = findVersionById(b.versionId, reader)!;
	if (version.targetPh !== null && b.measuredPh === null) return 'Record the measured pH first.';
	if (
		(version.osmolalityMinMOsmPerKg !== null || version.osmolalityMaxMOsmPerKg !== null) &&
		b.measuredOsmolality === null
	)
		return 'Record the measured osmolality first.';
	return null;
}

/**
 * What a line takes from its lot, in the lot's base unit (at least 1): a weighed mass converted
 * for a raw-material lot, or the volume added for a stock made here (kept in µL).
 */
export function takenFromLot(
	tx: Reader,
	b: Batch,
	lotRow: Lot,
	line: Pick<BatchLine, 'kind' | 'actualUg' | 'actualUl'>
): number {
	if (line.kind === 'stock' || !lotRow.componentId) return Math.max(1, line.actualUl ?? 0);
	const material =
		componentsOfVersion(b.versionId, [lotRow.componentId], tx).get(lotRow.componentId) ??
		findComponent(lotRow.componentId, tx)!;
	return Math.max(1, massToLotQuantity(convertMass(line.actualUg!, 'µg', 'g'), lotRow, material));
}

/** Takes from each lot used what its line's actual quantity is, with a ledger entry per lot. */
function consumeLots(
	tx: Tx,
	signer: Technician,
	b: Batch,
	lines: BatchLine[],
	today: string
): void {
	for (const line of lines.filter((l) => l.lotId)) {
		const lotRow = findLot(line.lotId!, tx)!;
		if (!isUsableLot(lotRow, today)) {
			throw new RuleError(
				`Lot ${lotRow.code} (line ${line.position}) is no longer released and in date; nothing was taken.`,
				{ status: 409 }
			);
		}
		const taken = takenFromLot(tx, b, lotRow, line);
		appendStockEntry(tx, {
			lotId: lotRow.id,
			kind: 'consumption',
			quantity: -taken,
			reason: `Batch ${b.number}, line ${line.position}`,
			batchId: b.id,
			actorId: signer.id
		});
		tx.update(batchLine)
			.set(lotRow.quantityKind === 'mass' ? { consumedMg: taken } : { consumedUl: taken })
			.where(eq(batchLine.id, line.id))
			.run();
	}
}

/**
 * The electronic signature that completes the batch. In the same transaction as the signature, stock
 * is taken from every lot used with its ledger entries; if any lot falls short, nothing is taken and
 * nothing is signed.
 */
export async function completeBatch(
	signer: Technician,
	batchId: string,
	input: { password: string; comment?: string },
	today = isoToday()
): Promise<void> {
	const b = requireBatch(batchId);
	const problem = completionProblem(b);
	if (problem) throw new RuleError(problem, { status: 409 });
	await signRecord(
		{
			user: signer,
			password: input.password,
			meaning: COMPLETION_MEANING,
			subjectType: 'batch',
			subjectId: b.id,
			subjectDigest: batchDigest(b),
			comment: input.comment?.trim() ?? '',
			address: signer.address ?? undefined
		},
		(tx) => {
			const now = requireBatch(batchId, tx);
			if (now.state !== 'in_preparation' || batchDigest(now, tx) !== batchDigest(b)) {
				throw new RuleError(
					'The batch changed while you were signing; nothing was taken or signed. Reload and look again.',
					{ status: 409 }
				);
			}
			const lines = tx.select().from(batchLine).where(eq(batchLine.batchId, b.id)).all();
			consumeLots(tx, signer, b, lines, today);
			tx.update(batch)
				.set({ state: 'prepared', preparedById: signer.id, preparedAt: new Date() })
				.where(eq(batch.id, b.id))
				.run();
			recordAudit(
				signer,
				{
					action: 'batch.prepared',
					subjectType: 'batch',
					subjectId: b.id,
					detail: { number: b.number, lots: lines.filter((l) => l.lotId).length }
				},
				tx
			);
		}
	);
}
