// A line signed as done is corrected by a new signed entry with its reason: the original stays in
// batch_line_correction (and the trail), the line shows the corrected value, and on a prepared
// batch the lot's ledger gets the difference back or takes it, so the ledger says what went in.
import { eq } from 'drizzle-orm';
import { checkTolerance, formatLineQuantity, readLineAmount } from '$lib/batches';
import { recordAudit } from '../audit';
import { db } from '../db';
import { batchDeviation, batchLine, batchLineCorrection, user, type Batch } from '../db/schema';
import type { BatchLine } from '../db/schema';
import { appendStockEntry, type Tx } from '../inventory/ledger';
import { findLot } from '../inventory/lots';
import { RuleError } from '../rule-error';
import { checkSigningPassword, digestOf, insertSignature } from '../signatures';
import { takenFromLot } from './completion';
import { requireBatch, requireLine, type Technician } from './execution';
import { requireWitnessBeyondBand } from './line-record';
import { buildSheetLines } from './sheet';
import { checkWitness, type Witness, type WitnessInput } from './witness';

export interface LineCorrection extends WitnessInput {
	actualText: string;
	reason: string;
	password: string;
}

function requireCorrectable(b: Batch, line: BatchLine): void {
	if (b.state !== 'in_preparation' && b.state !== 'prepared')
		throw new RuleError(
			`Batch ${b.number} is ${b.state === 'planned' ? 'not started' : 'reviewed'}; its lines can no longer be corrected.`,
			{ status: 409 }
		);
	if (!line.doneAt)
		throw new RuleError(`Line ${line.position} is not signed yet: record it instead.`, {
			field: 'actual',
			status: 409
		});
}

/** On a prepared batch the lot already gave the original amount: the ledger takes the difference. */
function settleLedger(
	tx: Tx,
	actor: Technician,
	b: Batch,
	line: BatchLine,
	corrected: Pick<BatchLine, 'kind' | 'actualUg' | 'actualUl'>
) {
	if (b.state !== 'prepared' || !line.lotId) return {};
	const lotRow = findLot(line.lotId, tx)!;
	const before = lotRow.quantityKind === 'mass' ? line.consumedMg : line.consumedUl;
	const after = takenFromLot(tx, b, lotRow, corrected);
	if (before !== null && before !== after)
		appendStockEntry(tx, {
			lotId: lotRow.id,
			kind: 'adjustment',
			quantity: before - after,
			reason: `Correction of batch ${b.number}, line ${line.position}`,
			batchId: b.id,
			actorId: actor.id
		});
	return lotRow.quantityKind === 'mass' ? { consumedMg: after } : { consumedUl: after };
}

interface CorrectedValue {
	toText: string;
	toUg: number | null;
	toUl: number | null;
	reason: string;
}

/** The corrector's signature and the correction row, which keeps what the line said before. */
function insertCorrection(
	tx: Tx,
	actor: Technician & { name: string },
	b: Batch,
	line: BatchLine,
	value: CorrectedValue
): string {
	const { toText, toUg, toUl, reason } = value;
	const signature = insertSignature(
		{
			signerId: actor.id,
			signerEmail: actor.email,
			signerName: actor.name,
			meaning: 'corrected',
			subjectType: 'batch_line',
			subjectId: line.id,
			subjectDigest: digestOf({
				batch: b.number,
				line: line.position,
				from: line.actualText,
				to: toText,
				reason
			}),
			comment: reason
		},
		tx
	);
	tx.insert(batchLineCorrection)
		.values({
			batchId: b.id,
			lineId: line.id,
			fromText: line.actualText ?? '',
			fromUg: line.actualUg,
			fromUl: line.actualUl,
			toText,
			toUg,
			toUl,
			reason,
			correctedById: actor.id,
			signatureId: signature.id
		})
		.run();
	return signature.id;
}

/** A corrected value outside the line's tolerance is a deviation, with the correction's reason. */
function recordCorrectedDeviation(
	tx: Tx,
	actor: Technician,
	b: Batch,
	line: BatchLine,
	quantities: { required: number; actual: number; reason: string }
): void {
	const { required, actual, reason } = quantities;
	const verdict = checkTolerance(required, actual, line.tolerancePercent);
	if (verdict === 'within') return;
	const show = (quantity: number) => formatLineQuantity(quantity, line.kind);
	tx.insert(batchDeviation)
		.values({
			batchId: b.id,
			lineId: line.id,
			kind: 'out_of_tolerance',
			detail: `Line ${line.position} corrected to ${show(actual)} against ${show(required)} ± ${line.tolerancePercent} % (${verdict}).`,
			reason,
			recordedById: actor.id
		})
		.run();
}

function writeCorrection(
	tx: Tx,
	actor: Technician & { name: string },
	b: Batch,
	line: BatchLine,
	input: LineCorrection,
	witness: Witness | null
): void {
	const parsed = readLineAmount(input.actualText, line.kind);
	if (!parsed.ok) throw new RuleError(parsed.message, { field: 'actual' });
	const toText = input.actualText.trim();
	if (toText === line.actualText)
		throw new RuleError(`Line ${line.position} already says ${toText}; nothing to correct.`, {
			field: 'actual'
		});
	const reason = input.reason.trim();
	const sheetLine = buildSheetLines(b, tx).find((l) => l.id === line.id)!;
	const required =
		(line.kind === 'component' ? line.requiredUg : line.requiredUl) ?? sheetLine.requiredQuantity;
	const witnessedBy = requireWitnessBeyondBand(tx, b, line, {
		required,
		actual: parsed.quantity,
		actualText: toText,
		witness
	});
	const toUg = line.kind === 'component' ? parsed.quantity : null;
	const toUl = line.kind === 'stock' ? parsed.quantity : null;
	const signatureId = insertCorrection(tx, actor, b, line, { toText, toUg, toUl, reason });
	const consumed = settleLedger(tx, actor, b, line, {
		kind: line.kind,
		actualUg: toUg,
		actualUl: toUl
	});
	tx.update(batchLine)
		.set({ actualText: toText, actualUg: toUg, actualUl: toUl, ...consumed })
		.where(eq(batchLine.id, line.id))
		.run();
	recordCorrectedDeviation(tx, actor, b, line, { required, actual: parsed.quantity, reason });
	recordAudit(
		actor,
		{
			action: 'batch.line_corrected',
			subjectType: 'batch',
			subjectId: b.id,
			detail: {
				line: line.position,
				changes: { actual: { from: line.actualText, to: toText } },
				reason,
				signatureId,
				witnessedBy: witnessedBy ?? undefined
			}
		},
		tx
	);
}

/**
 * Corrects a signed line: the corrector re-enters their password (a signed entry), gives the
 * reason, and beyond the hard band a second person witnesses the new value.
 */
export async function correctLine(
	actor: Technician,
	batchId: string,
	lineId: string,
	input: LineCorrection
): Promise<void> {
	const person = db.select().from(user).where(eq(user.id, actor.id)).get();
	if (!person || !person.active) throw new RuleError('This account cannot sign.', { status: 403 });
	if (input.reason.trim().length < 3) {
		recordAudit(actor, {
			action: 'batch.correction_refused',
			subjectType: 'batch',
			subjectId: batchId,
			detail: { lineId, to: input.actualText.trim(), reason: 'no reason given' }
		});
		throw new RuleError('Give the reason for the correction; it is kept with the original.', {
			field: 'reason'
		});
	}
	await checkSigningPassword(
		person,
		input.password,
		{
			subjectType: 'batch',
			subjectId: batchId,
			meaning: 'corrected',
			address: actor.address ?? null
		},
		{
			field: 'password',
			wrong: 'The password is not right for your account; nothing was corrected.',
			nothing: 'Nothing was corrected.'
		}
	);
	const witness = await checkWitness(actor, input, { subjectType: 'batch', subjectId: batchId });
	db.transaction((tx) => {
		const b = requireBatch(batchId, tx);
		const line = requireLine(b, lineId, tx);
		requireCorrectable(b, line);
		writeCorrection(tx, { ...actor, name: person.name }, b, line, input, witness);
	});
}

/** A line's corrections, oldest first, with who made them. */
export function correctionsOf(batchId: string) {
	return db
		.select({
			id: batchLineCorrection.id,
			lineId: batchLineCorrection.lineId,
			fromText: batchLineCorrection.fromText,
			toText: batchLineCorrection.toText,
			reason: batchLineCorrection.reason,
			at: batchLineCorrection.at,
			byName: user.name
		})
		.from(batchLineCorrection)
		.innerJoin(user, eq(user.id, batchLineCorrection.correctedById))
		.where(eq(batchLineCorrection.batchId, batchId))
		.orderBy(batchLineCorrection.at)
		.all();
}
