import { and, eq, isNull } from 'drizzle-orm';
import { checkTolerance, formatLineQuantity, readLineAmount } from '$lib/batches';
import { isoToday, isUsableLot } from '$lib/inventory';
import { recordAudit } from '../audit';
import { db, type Db } from '../db';
import { batchDeviation, batchLine, type Batch, type BatchLine } from '../db/schema';
import { findLot } from '../inventory/lots';
import { RuleError } from '../rule-error';
import {
	markStarted,
	requireBatch,
	requireLine,
	requireOpen,
	type Reader,
	type Technician
} from './execution';
import { buildSheetLines } from './sheet';
import { hardBandPercent, isBeyondHardBand } from './weighing-band';
import { checkWitness, recordWitnessSignature, type Witness, type WitnessInput } from './witness';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export interface LineRecord {
	actualText: string;
	reason?: string;
}

/** Lines are added in the order of the sheet: no earlier line may still be open. */
function requireNextInOrder(b: Batch, line: BatchLine, reader: Reader): void {
	const earlier = reader
		.select({ position: batchLine.position })
		.from(batchLine)
		.where(and(eq(batchLine.batchId, b.id), isNull(batchLine.doneAt)))
		.all()
		.filter((l) => l.position < line.position)
		.sort((x, y) => x.position - y.position)[0];
	if (earlier)
		throw new RuleError(
			`Add in the order of the sheet: line ${earlier.position} comes before line ${line.position}.`,
			{ field: 'actual', status: 409 }
		);
}

/**
 * Where what went in came from: the scanned lot of a component line, or the scanned stock batch
 * of a stock line, still usable. Returns the stock's code for a stock line ('' otherwise).
 */
function readSource(line: BatchLine, today: string, reader: Reader): string {
	if (!line.lotId)
		throw new RuleError(
			line.kind === 'stock'
				? `Scan the stock bottle for line ${line.position} first (its batch number).`
				: `Scan the lot for line ${line.position} first.`,
			{ field: 'scan' }
		);
	const lotRow = findLot(line.lotId, reader)!;
	if (!isUsableLot(lotRow, today)) {
		throw new RuleError(
			`${line.kind === 'stock' ? 'Stock' : 'Lot'} ${lotRow.code} is no longer released and in date; scan another.`,
			{ field: 'scan', status: 409 }
		);
	}
	return line.kind === 'stock' ? lotRow.code : '';
}

/** Out of tolerance needs a reason of at least 3 characters, kept as a deviation of the line. */
function recordToleranceDeviation(
	tx: Pick<Db, 'insert'>,
	actor: Technician,
	b: Batch,
	line: BatchLine,
	lineName: string,
	quantities: { required: number; actual: number; verdict: string; reason: string }
): void {
	const { required, actual, verdict, reason } = quantities;
	const show = (quantity: number) => formatLineQuantity(quantity, line.kind);
	if (reason.length < 3) {
		throw new RuleError(
			`${show(actual)} is ${verdict} the tolerance (${show(required)} ± ${line.tolerancePercent} %). Give the reason; it is recorded as a deviation.`,
			{ field: 'reason', status: 422 }
		);
	}
	tx.insert(batchDeviation)
		.values({
			batchId: b.id,
			lineId: line.id,
			kind: 'out_of_tolerance',
			detail: `Line ${line.position} ${lineName}: ${show(actual)} against ${show(required)} ± ${line.tolerancePercent} % (${verdict}).`,
			reason,
			recordedById: actor.id
		})
		.run();
}

/**
 * Beyond the site's hard band a weighing needs a second person's signature, recorded with it.
 * Returns the witness's e-mail when one signed.
 */
export function requireWitnessBeyondBand(
	tx: Tx,
	b: Batch,
	line: BatchLine,
	weighed: { required: number; actual: number; actualText: string; witness: Witness | null }
): string | null {
	const band = hardBandPercent(tx);
	if (!isBeyondHardBand(weighed.required, weighed.actual, band)) return null;
	if (!weighed.witness) {
		const show = (quantity: number) => formatLineQuantity(quantity, line.kind);
		throw new RuleError(
			`${show(weighed.actual)} is more than ${band} % from ${show(weighed.required)}: check the balance and the unit. If it is right, a second person must witness it: enter their e-mail and password.`,
			{ field: 'witnessEmail', status: 422 }
		);
	}
	recordWitnessSignature(
		tx,
		weighed.witness,
		{ subjectType: 'batch_line', subjectId: line.id },
		{
			batch: b.number,
			line: line.position,
			actual: weighed.actualText,
			required: weighed.required,
			bandPercent: band
		}
	);
	return weighed.witness.email;
}

/** The bench's way in: checks a named witness's password first, then records the line. */
export async function recordLineAtBench(
	actor: Technician,
	batchId: string,
	lineId: string,
	input: LineRecord & WitnessInput,
	today = isoToday()
): Promise<{ repeated: boolean; verdict: string }> {
	const witness = await checkWitness(actor, input, { subjectType: 'batch', subjectId: batchId });
	return recordLine(actor, batchId, lineId, input, today, witness);
}

/**
 * Records what went in and signs the line as done. Out of tolerance needs a reason, kept as a
 * deviation. Sending the same record again (a double tap, a resend after a lost connection) is a no-op.
 */
export function recordLine(
	actor: Technician,
	batchId: string,
	lineId: string,
	input: LineRecord,
	today = isoToday(),
	witness: Witness | null = null
): { repeated: boolean; verdict: string } {
	return db.transaction((tx) => {
		const b = requireBatch(batchId, tx);
		const line = requireLine(b, lineId, tx);
		if (line.doneAt) {
			if (line.actualText === input.actualText.trim())
				return { repeated: true, verdict: 'already recorded' };
			throw new RuleError(
				`Line ${line.position} is already signed as done with ${line.actualText}; a signed line cannot change.`,
				{ field: 'actual', status: 409 }
			);
		}
		requireOpen(b);
		requireNextInOrder(b, line, tx);

		const sheetLine = buildSheetLines(b, tx, today).find((l) => l.id === line.id)!;
		const parsed = readLineAmount(input.actualText, line.kind);
		if (!parsed.ok) throw new RuleError(parsed.message, { field: 'actual' });
		const actualQuantity = parsed.quantity;
		const stockSource = readSource(line, today, tx);
		const required =
			line.kind === 'component'
				? (line.requiredUg ?? sheetLine.requiredQuantity)
				: sheetLine.requiredQuantity;
		const verdict = checkTolerance(required, actualQuantity, line.tolerancePercent);
		const reason = (input.reason ?? '').trim();
		if (verdict !== 'within') {
			recordToleranceDeviation(tx, actor, b, line, sheetLine.name, {
				required,
				actual: actualQuantity,
				verdict,
				reason
			});
		}
		const witnessed = requireWitnessBeyondBand(tx, b, line, {
			required,
			actual: actualQuantity,
			actualText: input.actualText.trim(),
			witness
		});
		markStarted(tx, actor, b);
		tx.update(batchLine)
			.set({
				...(line.kind === 'component'
					? { actualUg: actualQuantity, requiredUg: required }
					: { actualUl: actualQuantity, requiredUl: required }),
				actualText: input.actualText.trim(),
				stockSource,
				doneById: actor.id,
				doneAt: new Date()
			})
			.where(eq(batchLine.id, line.id))
			.run();
		recordAudit(
			actor,
			{
				action: 'batch.line_done',
				subjectType: 'batch',
				subjectId: b.id,
				detail: {
					line: line.position,
					actual: input.actualText.trim(),
					verdict,
					reason: reason || undefined,
					witnessedBy: witnessed ?? undefined
				}
			},
			tx
		);
		return { repeated: false, verdict };
	});
}
