import { eq } from 'drizzle-orm';
import { formatLineQuantity } from '$lib/batches';
import { formatQuantity, isoToday, lotUnusability } from '$lib/inventory';
import { batchVolumeL } from '$lib/quantities';
import { recordAudit } from '../audit';
import { db } from '../db';
import { batchLine, recipeLine, type Batch, type BatchLine, type Lot } from '../db/schema';
import { onHandOf } from '../inventory/ledger';
import { findLot, findLotByCode } from '../inventory/lots';
import { materialOfLot } from '../inventory/material';
import { RuleError } from '../rule-error';
import { componentsOfVersion } from '../recipes/snapshot';
import {
	markStarted,
	requireBatch,
	requireLine,
	requireOpen,
	type Reader,
	type Technician
} from './execution';
import { buildSheetLines, requirementFor } from './sheet';
import { stockLotRefusal } from './stock-lots';

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
		const actual = materialOfLot(lotRow).name;
		return `Wrong lot: ${lotRow.code} is ${actual}; this line needs ${line.name}.`;
	}
	const unusable = lotUnusability(lotRow, today);
	if (unusable === 'quarantine' || unusable === 'rejected')
		return `Lot ${lotRow.code} is ${unusable === 'quarantine' ? 'in quarantine' : 'rejected'}, not released for use.`;
	if (unusable === 'expired')
		return `Lot ${lotRow.code} is expired: its ${lotRow.dateKind} date was ${lotRow.expiresOn}.`;
	if (unusable === 'retest')
		return `Lot ${lotRow.code} is due for retest since ${lotRow.retestOn}; it may not be used until it is retested.`;
	if (onHand < neededInLotUnits) {
		return `Lot ${lotRow.code} has ${formatQuantity(onHand, lotRow.quantityKind)} on hand; this line needs ${formatQuantity(neededInLotUnits, lotRow.quantityKind)}.`;
	}
	return null;
}

/** A line that can take a lot (a raw-material lot, or the stock batch it adds): not yet signed. */
function requireLineForLot(line: BatchLine): void {
	if (line.doneAt)
		throw new RuleError(`Line ${line.position} is already signed as done; its lot cannot change.`, {
			field: 'scan',
			status: 409
		});
}

function unknownLotMessage(scanned: string): string {
	return scanned.trim()
		? `“${scanned.trim()}” is not a lot known here. Scan the label of a lot, or type its lot id (like L-2026-0001).`
		: 'Scan or type a lot id.';
}

/** What the line needs from this lot, in the lot's units and in µg (zero for a lot of another component). */
function lotRequirement(
	b: Batch,
	line: BatchLine,
	found: Lot,
	sheetComponentId: string | null,
	reader: Reader
): { need: number; requiredUg: number } {
	if (found.componentId !== sheetComponentId) return { need: 0, requiredUg: 0 };
	const source = reader
		.select()
		.from(recipeLine)
		.where(eq(recipeLine.id, line.recipeLineId))
		.get()!;
	const kept = componentsOfVersion(
		b.versionId,
		[source.componentId!, source.shelfFormId ?? ''],
		reader
	);
	const basis = kept.get(source.componentId!)!;
	const shelf =
		source.shelfFormId && source.shelfFormId !== source.componentId
			? (kept.get(source.shelfFormId) ?? null)
			: null;
	const requirement = requirementFor(
		{ amount: source.amount, unit: source.unit, component: basis, shelf },
		batchVolumeL(b.targetVolumeMl),
		found,
		shelf ?? basis
	);
	return { need: requirement.inLotUnits ?? 0, requiredUg: requirement.requiredUg };
}

/** A refused scan: what was tried and why, written to the trail after the refused work rolls back. */
class ScanRefused extends RuleError {
	constructor(
		message: string,
		readonly batchId: string,
		readonly detail: { line: number; scanned: string; lot: string | null; reason: string },
		status: RuleError['status'] = 422
	) {
		super(message, { field: 'scan', status });
	}
}

function refuseScan(b: Batch, line: BatchLine, scanned: string, found: Lot | null, reason: string) {
	return new ScanRefused(reason, b.id, {
		line: line.position,
		scanned: scanned.trim().slice(0, 200),
		lot: found?.code ?? null,
		reason
	});
}

/** The technician scans a lot label for a line. A repeat scan of the same lot changes nothing. */
export function chooseLot(
	actor: Technician,
	batchId: string,
	lineId: string,
	scanned: string,
	today = isoToday()
): { lotCode: string; requiredText: string; repeated: boolean } {
	try {
		return recordLotChoice(actor, batchId, lineId, scanned, today);
	} catch (error) {
		if (error instanceof ScanRefused) {
			recordAudit(actor, {
				action: 'batch.lot_refused',
				subjectType: 'batch',
				subjectId: error.batchId,
				detail: error.detail
			});
		}
		throw error;
	}
}

function recordLotChoice(
	actor: Technician,
	batchId: string,
	lineId: string,
	scanned: string,
	today: string
): { lotCode: string; requiredText: string; repeated: boolean } {
	return db.transaction((tx) => {
		const b = requireBatch(batchId, tx);
		requireOpen(b);
		const line = requireLine(b, lineId, tx);
		requireLineForLot(line);
		const found = lotFromScan(scanned, tx);
		if (!found) throw refuseScan(b, line, scanned, null, unknownLotMessage(scanned));
		if (line.lotId === found.id) {
			return {
				lotCode: found.code,
				requiredText: formatLineQuantity(
					(line.kind === 'stock' ? line.requiredUl : line.requiredUg) ?? 0,
					line.kind
				),
				repeated: true
			};
		}
		const sheetLine = buildSheetLines(b, tx, today).find((l) => l.id === line.id)!;
		const onHand = onHandOf(found.id, tx);
		let required: { requiredUg: number } | { requiredUl: number };
		let refusal: string | null;
		if (line.kind === 'stock') {
			required = { requiredUl: sheetLine.requiredQuantity };
			refusal = stockLotRefusal(
				found,
				{ stockRecipeId: line.stockRecipeId!, name: sheetLine.name },
				sheetLine.requiredQuantity,
				onHand,
				tx,
				today
			);
		} else {
			const { need, requiredUg } = lotRequirement(b, line, found, sheetLine.componentId, tx);
			required = { requiredUg };
			refusal = lotRefusal(
				found,
				{ componentId: sheetLine.componentId, name: sheetLine.name },
				need,
				onHand,
				today
			);
		}
		if (refusal) throw refuseScan(b, line, scanned, found, refusal);
		markStarted(tx, actor, b);
		tx.update(batchLine)
			.set({ lotId: found.id, ...required })
			.where(eq(batchLine.id, line.id))
			.run();
		recordAudit(
			actor,
			{
				action: 'batch.lot_chosen',
				subjectType: 'batch',
				subjectId: b.id,
				detail: { line: line.position, lot: found.code, ...required }
			},
			tx
		);
		const quantity = 'requiredUg' in required ? required.requiredUg : required.requiredUl;
		return {
			lotCode: found.code,
			requiredText: formatLineQuantity(quantity, line.kind),
			repeated: false
		};
	});
}
