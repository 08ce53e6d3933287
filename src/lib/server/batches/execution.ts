import { and, eq, isNull, sql } from 'drizzle-orm';
import {
	BATCH_STATE_LABELS,
	checkTolerance,
	COMPLETION_MEANING,
	formatLineQuantity,
	readLineAmount
} from '$lib/batches';
import { formatQuantity, isoToday, isUsableLot, lotUnusability } from '$lib/inventory';
import { recordAudit, type Actor } from '../audit';
import { findComponent } from '../components/library';
import { db, type Db } from '../db';
import {
	batch,
	batchDeviation,
	batchLine,
	recipeLine,
	type Batch,
	type BatchLine,
	type Lot
} from '../db/schema';
import { appendStockEntry, onHandOf } from '../inventory/ledger';
import { findLot, findLotByCode } from '../inventory/lots';
import { massToLotQuantity } from '../inventory/units';
import { findVersionById } from '../recipes/queries';
import { RuleError } from '../rule-error';
import { digestOf, signRecord } from '../signatures';
import { batchVolumeL, convertMass, readDecimalText } from '$lib/quantities';
import { buildSheetLines, phRange, requirementFor } from './sheet';

type Reader = Pick<Db, 'select'>;
export type Technician = Actor & { id: string; email: string };

export function findBatch(id: string, reader: Reader = db): Batch | undefined {
	return reader.select().from(batch).where(eq(batch.id, id)).get();
}

export function requireBatch(id: string, reader: Reader = db): Batch {
	const found = findBatch(id, reader);
	if (!found) throw new RuleError('No batch with this id.', { status: 404 });
	return found;
}

function requireOpen(b: Batch): void {
	if (b.state !== 'planned' && b.state !== 'in_preparation') {
		throw new RuleError(
			`Batch ${b.number} is ${BATCH_STATE_LABELS[b.state].toLowerCase()}; its record is closed.`,
			{ status: 409 }
		);
	}
}

function requireLine(b: Batch, lineId: string, reader: Reader): BatchLine {
	const line = reader
		.select()
		.from(batchLine)
		.where(and(eq(batchLine.id, lineId), eq(batchLine.batchId, b.id)))
		.get();
	if (!line) throw new RuleError('No such line on this batch.', { status: 404 });
	return line;
}

/** planned → in preparation, the first time a technician works on it. */
function markStarted(tx: Pick<Db, 'update'>, actor: Technician, b: Batch): void {
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

/**
 * What a scanned or typed code names: a lot id (L-2026-0001), the lot's record id, or a URL that
 * contains either (labels from elsewhere may carry a link).
 */
export function lotFromScan(text: string, reader: Reader = db): Lot | undefined {
	const trimmed = text.trim();
	if (!trimmed) return undefined;
	const candidates = [trimmed];
	try {
		const url = new URL(trimmed);
		candidates.push(
			...url.pathname.split('/').filter(Boolean).reverse(),
			...url.searchParams.values()
		);
	} catch {
		// not a URL: the text itself is the candidate
	}
	for (const candidate of candidates) {
		const found =
			findLotByCode(decodeURIComponent(candidate), reader) ?? findLot(candidate, reader);
		if (found) return found;
	}
	return undefined;
}

/** Why a lot may not be used for a line, or null when it may. */
export function lotRefusal(
	lotRow: Lot,
	line: { componentId: string | null; name: string },
	neededInLotUnits: number,
	onHand: number,
	today = isoToday()
): string | null {
	if (lotRow.componentId !== line.componentId) {
		const actual = findComponent(lotRow.componentId)?.name ?? lotRow.componentId;
		return `Wrong lot: ${lotRow.code} is ${actual}; this line needs ${line.name}.`;
	}
	const unusable = lotUnusability(lotRow, today);
	if (unusable === 'quarantine' || unusable === 'rejected')
		return `Lot ${lotRow.code} is ${unusable === 'quarantine' ? 'in quarantine' : 'rejected'}, not released for use.`;
	if (unusable === 'expired')
		return `Lot ${lotRow.code} is expired: its ${lotRow.dateKind} date was ${lotRow.expiresOn}.`;
	if (onHand < neededInLotUnits) {
		return `Lot ${lotRow.code} has ${formatQuantity(onHand, lotRow.quantityKind)} on hand; this line needs ${formatQuantity(neededInLotUnits, lotRow.quantityKind)}.`;
	}
	return null;
}

/** The technician scans a lot label for a line. A repeat scan of the same lot changes nothing. */
export function chooseLot(
	actor: Technician,
	batchId: string,
	lineId: string,
	scanned: string,
	today = isoToday()
): { lotCode: string; requiredText: string; repeated: boolean } {
	return db.transaction((tx) => {
		const b = requireBatch(batchId, tx);
		requireOpen(b);
		const line = requireLine(b, lineId, tx);
		if (line.kind !== 'component')
			throw new RuleError('A stock line has no lot to scan; record the stock you add.', {
				field: 'scan'
			});
		if (line.doneAt)
			throw new RuleError(
				`Line ${line.position} is already signed as done; its lot cannot change.`,
				{ field: 'scan', status: 409 }
			);
		const found = lotFromScan(scanned, tx);
		if (!found) {
			throw new RuleError(
				scanned.trim()
					? `“${scanned.trim()}” is not a lot known here. Scan the label of a lot, or type its lot id (like L-2026-0001).`
					: 'Scan or type a lot id.',
				{ field: 'scan' }
			);
		}
		if (line.lotId === found.id) {
			return {
				lotCode: found.code,
				requiredText: formatLineQuantity(line.requiredUg ?? 0, 'component'),
				repeated: true
			};
		}
		const sheetLine = buildSheetLines(b, tx, today).find((l) => l.id === line.id)!;
		let need = 0;
		let requiredUg = 0;
		if (found.componentId === sheetLine.componentId) {
			const source = tx
				.select()
				.from(recipeLine)
				.where(eq(recipeLine.id, line.recipeLineId))
				.get()!;
			const basis = findComponent(source.componentId!, tx)!;
			const shelf =
				source.shelfFormId && source.shelfFormId !== source.componentId
					? (findComponent(source.shelfFormId, tx) ?? null)
					: null;
			const requirement = requirementFor(
				{ amount: source.amount, unit: source.unit, component: basis, shelf },
				batchVolumeL(b.targetVolumeMl),
				found,
				shelf ?? basis
			);
			need = requirement.inLotUnits ?? 0;
			requiredUg = requirement.requiredUg;
		}
		const refusal = lotRefusal(
			found,
			{ componentId: sheetLine.componentId, name: sheetLine.name },
			need,
			onHandOf(found.id, tx),
			today
		);
		if (refusal) {
			recordAudit(
				actor,
				{
					action: 'batch.lot_refused',
					subjectType: 'batch',
					subjectId: b.id,
					detail: {
						line: line.position,
						scanned: scanned.trim().slice(0, 200),
						lot: found.code,
						reason: refusal
					}
				},
				tx
			);
			throw new RuleError(refusal, { field: 'scan', status: 422 });
		}
		markStarted(tx, actor, b);
		tx.update(batchLine)
			.set({ lotId: found.id, requiredUg })
			.where(eq(batchLine.id, line.id))
			.run();
		recordAudit(
			actor,
			{
				action: 'batch.lot_chosen',
				subjectType: 'batch',
				subjectId: b.id,
				detail: { line: line.position, lot: found.code, requiredUg }
			},
			tx
		);
		return {
			lotCode: found.code,
			requiredText: formatLineQuantity(requiredUg, 'component'),
			repeated: false
		};
	});
}

export interface LineRecord {
	actualText: string;
	reason?: string;
	stockSource?: string;
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
	today = isoToday()
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
		const earlier = tx
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

		const sheetLine = buildSheetLines(b, tx, today).find((l) => l.id === line.id)!;
		const parsed = readLineAmount(input.actualText, line.kind);
		if (!parsed.ok) throw new RuleError(parsed.message, { field: 'actual' });
		const actualQuantity = parsed.quantity;
		let stockSource = '';
		if (line.kind === 'component') {
			if (!line.lotId)
				throw new RuleError(`Scan the lot for line ${line.position} first.`, { field: 'scan' });
			const lotRow = findLot(line.lotId, tx)!;
			if (!isUsableLot(lotRow, today)) {
				throw new RuleError(
					`Lot ${lotRow.code} is no longer released and in date; scan another lot.`,
					{ field: 'scan', status: 409 }
				);
			}
		} else {
			stockSource = (input.stockSource ?? '').trim();
			if (!stockSource)
				throw new RuleError('Say which stock bottle you used (its batch number).', {
					field: 'stockSource'
				});
			if (stockSource.length > 80)
				throw new RuleError('At most 80 characters.', { field: 'stockSource' });
		}
		const required =
			line.kind === 'component'
				? (line.requiredUg ?? sheetLine.requiredQuantity)
				: sheetLine.requiredQuantity;
		const verdict = checkTolerance(required, actualQuantity, line.tolerancePercent);
		const reason = (input.reason ?? '').trim();
		const show = (quantity: number) => formatLineQuantity(quantity, line.kind);
		if (verdict !== 'within') {
			if (reason.length < 3) {
				throw new RuleError(
					`${show(actualQuantity)} is ${verdict} the tolerance (${show(required)} ± ${line.tolerancePercent} %). Give the reason; it is recorded as a deviation.`,
					{ field: 'reason', status: 422 }
				);
			}
			tx.insert(batchDeviation)
				.values({
					batchId: b.id,
					lineId: line.id,
					kind: 'out_of_tolerance',
					detail: `Line ${line.position} ${sheetLine.name}: ${show(actualQuantity)} against ${show(required)} ± ${line.tolerancePercent} % (${verdict}).`,
					reason,
					recordedById: actor.id
				})
				.run();
		}
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
					reason: reason || undefined
				}
			},
			tx
		);
		return { repeated: false, verdict };
	});
}

export interface MeasurementInput {
	ph: string;
	osmolality: string;
	phReason?: string;
	osmolalityReason?: string;
}

/** The measured pH and osmolality, checked against the recipe's range; out of range needs a reason. */
export function recordMeasurements(
	actor: Technician,
	batchId: string,
	input: MeasurementInput
): void {
	db.transaction((tx) => {
		const b = requireBatch(batchId, tx);
		requireOpen(b);
		const version = findVersionById(b.versionId, tx)!;
		const read = (text: string, field: string, label: string) => {
			if (!text.trim()) return null;
			const parsed = readDecimalText(text, label);
			if (!parsed.ok) throw new RuleError(parsed.message, { field });
			return parsed.value;
		};
		const ph = read(input.ph, 'ph', 'Measured pH');
		const osmolality = read(input.osmolality, 'osmolality', 'Measured osmolality');
		if (ph !== null && (ph < 0 || ph > 14))
			throw new RuleError('A pH is between 0 and 14.', { field: 'ph' });
		if (osmolality !== null && (osmolality <= 0 || osmolality > 5000))
			throw new RuleError('An osmolality is above 0 and at most 5000 mOsm/kg.', {
				field: 'osmolality'
			});
		const range = phRange(version.targetPh);
		if (range && ph === null) throw new RuleError('Enter the measured pH.', { field: 'ph' });
		const osmoTarget =
			version.osmolalityMinMOsmPerKg !== null || version.osmolalityMaxMOsmPerKg !== null;
		if (osmoTarget && osmolality === null)
			throw new RuleError('Enter the measured osmolality.', { field: 'osmolality' });
		const deviations: {
			kind: 'ph' | 'osmolality';
			detail: string;
			reason: string;
			field: string;
		}[] = [];
		if (range && ph !== null && (ph < range.min || ph > range.max)) {
			deviations.push({
				kind: 'ph',
				detail: `pH ${ph} outside ${range.min}–${range.max} (target ${version.targetPh} ± 0.2, common practice).`,
				reason: (input.phReason ?? '').trim(),
				field: 'phReason'
			});
		}
		if (osmolality !== null && osmoTarget) {
			const min = version.osmolalityMinMOsmPerKg ?? -Infinity;
			const max = version.osmolalityMaxMOsmPerKg ?? Infinity;
			if (osmolality < min || osmolality > max) {
				deviations.push({
					kind: 'osmolality',
					detail: `Osmolality ${osmolality} mOsm/kg outside ${version.osmolalityMinMOsmPerKg ?? '…'}–${version.osmolalityMaxMOsmPerKg ?? '…'} mOsm/kg.`,
					reason: (input.osmolalityReason ?? '').trim(),
					field: 'osmolalityReason'
				});
			}
		}
		for (const d of deviations) {
			if (d.reason.length < 3)
				throw new RuleError(`${d.detail} Give the reason; it is recorded as a deviation.`, {
					field: d.field,
					status: 422
				});
		}
		for (const d of deviations)
			tx.insert(batchDeviation)
				.values({
					batchId: b.id,
					kind: d.kind,
					detail: d.detail,
					reason: d.reason,
					recordedById: actor.id
				})
				.run();
		markStarted(tx, actor, b);
		tx.update(batch)
			.set({ measuredPh: ph, measuredOsmolality: osmolality })
			.where(eq(batch.id, b.id))
			.run();
		recordAudit(
			actor,
			{
				action: 'batch.measured',
				subjectType: 'batch',
				subjectId: b.id,
				detail: { ph, osmolality, deviations: deviations.length }
			},
			tx
		);
	});
}

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
			for (const line of lines.filter((l) => l.lotId)) {
				const lotRow = findLot(line.lotId!, tx)!;
				if (!isUsableLot(lotRow, today)) {
					throw new RuleError(
						`Lot ${lotRow.code} (line ${line.position}) is no longer released and in date; nothing was taken.`,
						{ status: 409 }
					);
				}
				const material = findComponent(lotRow.componentId, tx)!;
				const taken = Math.max(
					1,
					massToLotQuantity(convertMass(line.actualUg!, 'µg', 'g'), lotRow, material)
				);
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
