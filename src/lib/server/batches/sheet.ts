import { and, asc, eq, inArray } from 'drizzle-orm';
import {
	checkTolerance,
	DEFAULT_PH_TOLERANCE,
	formatLineQuantity,
	lineQuantityUnit
} from '$lib/batches';
import { formatQuantity, isExpired, isoToday } from '$lib/inventory';
import { batchVolumeL, storedMass, storedVolumeUl } from '$lib/quantities';
import { componentsOfVersion } from '../recipes/snapshot';
import { db, type Db } from '../db';
import {
	batchLine,
	lot,
	recipeLine,
	type Batch,
	type BatchLine,
	type Component,
	type Lot,
	type RecipeLine
} from '../db/schema';
import { onHandColumn } from '../inventory/ledger';
import { usableLotCondition } from '../inventory/usable';
import { massToLotQuantity } from '../inventory/units';
import { findRecipe } from '../recipes/queries';
import { scaleComponentLine, scaleStockLine } from './scaling';
import { usableStockLots } from './stock-lots';

type Reader = Pick<Db, 'select'>;

import type { LotChoice, SheetLine } from '$lib/batches';

export type { LotChoice, SheetLine };

function choiceOf(row: Lot, onHand: number, today: string): LotChoice {
	return {
		id: row.id,
		code: row.code,
		expiresOn: row.expiresOn,
		dateKind: row.dateKind,
		status: row.status,
		expired: isExpired(row.expiresOn, today),
		assayPercent: row.assayPercent,
		waterContentPercent: row.waterContentPercent,
		onHand,
		quantityKind: row.quantityKind,
		supplier: row.supplier,
		supplierLot: row.supplierLot
	};
}

type RequirementLine = {
	amount: number;
	unit: string;
	component: Component;
	shelf: Component | null;
};

/**
 * What one component line needs, for a lot (its assay and water content) or nominal without one: µg to
 * weigh, that mass in the lot's base unit (for the stock check), and the working. Reads no database.
 */
export function requirementFor(
	line: RequirementLine,
	volumeL: number,
	lotRow: Pick<Lot, 'assayPercent' | 'waterContentPercent' | 'quantityKind'> | null,
	weighed: Component
) {
	const scaled = scaleComponentLine(
		{ amount: line.amount, unit: line.unit, component: line.component, shelfForm: line.shelf },
		volumeL,
		lotRow
	);
	const requiredUg = storedMass(scaled.massG, 'g', 'µg');
	const inLotUnits = lotRow ? Math.max(1, massToLotQuantity(scaled.massG, lotRow, weighed)) : null;
	return { requiredUg, inLotUnits, steps: scaled.steps };
}

/** What one stock line needs: µL of stock and the working. Reads no database. */
export function stockRequirement(
	doseMlPerL: number,
	volumeL: number
): { requiredUl: number; steps: string[] } {
	const scaled = scaleStockLine(doseMlPerL, volumeL);
	return { requiredUl: storedVolumeUl(scaled.volumeMl, 'mL'), steps: scaled.steps };
}

/** Released, in-date lots of a component, first-expired first (FEFO), then first received. */
export function usableLots(
	componentId: string,
	reader: Reader = db,
	today = isoToday()
): { row: Lot; onHand: number }[] {
	return reader
		.select({ row: lot, onHand: onHandColumn })
		.from(lot)
		.where(and(eq(lot.componentId, componentId), usableLotCondition(today)))
		.orderBy(asc(lot.expiresOn), asc(lot.receivedOn), asc(lot.code))
		.all();
}

type Requirement = ReturnType<typeof requirementFor>;

/**
 * The lot to suggest for a line not yet done: the first usable lot, first-expired first, that holds
 * enough for the line as that lot needs it; or why there is none.
 */
export function suggestLot(
	line: RequirementLine,
	weighed: Component,
	volumeL: number,
	candidates: { row: Lot; onHand: number }[],
	today: string
): { suggestion: LotChoice | null; requirement: Requirement | null; note: string | null } {
	for (const candidate of candidates) {
		const need = requirementFor(line, volumeL, candidate.row, weighed);
		if (candidate.onHand >= (need.inLotUnits ?? 0))
			return {
				suggestion: choiceOf(candidate.row, candidate.onHand, today),
				requirement: need,
				note: null
			};
	}
	const note = candidates.length
		? `No released, in-date lot of ${weighed.name} has enough on hand for this line.`
		: `No released, in-date lot of ${weighed.name} is in stock.`;
	return { suggestion: null, requirement: null, note };
}

/** Everything a sheet reads once for all its lines. */
function loadSheet(b: Batch, reader: Reader) {
	const lines = reader
		.select()
		.from(batchLine)
		.where(eq(batchLine.batchId, b.id))
		.orderBy(asc(batchLine.position))
		.all();
	const recipeLines = new Map(
		lines.length
			? reader
					.select()
					.from(recipeLine)
					.where(
						inArray(
							recipeLine.id,
							lines.map((l) => l.recipeLineId)
						)
					)
					.all()
					.map((r) => [r.id, r])
			: []
	);
	// The approved version's snapshot: a later edit of the library does not change the sheet.
	const components = componentsOfVersion(
		b.versionId,
		[...recipeLines.values()].flatMap((r) => [r.componentId ?? '', r.shelfFormId ?? '']),
		reader
	);
	const chosenIds = lines.map((l) => l.lotId).filter((id): id is string => Boolean(id));
	// A batch has at most one chosen lot per recipe line, far fewer than SQLite's parameter limit.
	const chosen = chosenIds.length
		? reader
				.select({ row: lot, onHand: onHandColumn })
				.from(lot)
				.where(inArray(lot.id, chosenIds))
				.all()
		: [];
	return {
		lines,
		recipeLines,
		components,
		chosenRows: new Map(chosen.map((c) => [c.row.id, c.row])),
		chosenOnHand: new Map(chosen.map((c) => [c.row.id, c.onHand]))
	};
}

type LoadedSheet = ReturnType<typeof loadSheet>;

function baseOf(line: BatchLine, source: RecipeLine, chosenRow: Lot | null) {
	return {
		id: line.id,
		position: line.position,
		kind: line.kind,
		quantityUnit: lineQuantityUnit(line.kind),
		amount: source.amount,
		unit: source.unit,
		note: source.note,
		tolerancePercent: line.tolerancePercent,
		actualQuantity: line.kind === 'component' ? line.actualUg : line.actualUl,
		actualText: line.actualText,
		doneAt: line.doneAt,
		doneById: line.doneById,
		stockSource: line.stockSource,
		consumedText: consumedTextOf(line, chosenRow)
	};
}

function consumedTextOf(line: BatchLine, chosenRow: Lot | null): string | null {
	if (!chosenRow) return null;
	const consumed = chosenRow.quantityKind === 'mass' ? line.consumedMg : line.consumedUl;
	return consumed === null ? null : formatQuantity(consumed, chosenRow.quantityKind);
}

/** The first released, in-date batch of the stock with enough left for the line, or why none. */
function suggestStock(
	stockRecipeId: string,
	name: string,
	requiredUl: number,
	reader: Reader,
	today: string
) {
	const candidates = usableStockLots(stockRecipeId, reader, today);
	const enough = candidates.find((c) => c.onHand >= requiredUl);
	if (enough) return { suggestion: choiceOf(enough.row, enough.onHand, today), note: null };
	return {
		suggestion: null,
		note: candidates.length
			? `No released batch of ${name} has enough left for this line.`
			: `No released, in-date batch of ${name} is in stock: make and release one first.`
	};
}

function stockSheetLine(
	line: BatchLine,
	source: RecipeLine,
	sheet: LoadedSheet,
	volumeL: number,
	reader: Reader,
	today: string
): SheetLine {
	const { requiredUl: nominalUl, steps } = stockRequirement(source.amount, volumeL);
	const requiredUl = line.requiredUl ?? nominalUl;
	const name = findRecipe(source.stockRecipeId!, reader)?.name ?? 'Stock solution';
	const chosenRow = line.lotId ? (sheet.chosenRows.get(line.lotId) ?? null) : null;
	const suggested = line.doneAt
		? null
		: suggestStock(source.stockRecipeId!, name, requiredUl, reader, today);
	return {
		...baseOf(line, source, chosenRow),
		kind: 'stock',
		name,
		basisName: null,
		componentId: null,
		stockRecipeId: source.stockRecipeId,
		formula: null,
		requiredQuantity: requiredUl,
		requiredFor: chosenRow ? 'chosen' : 'nominal',
		requiredText: formatLineQuantity(requiredUl, 'stock'),
		steps,
		chosen: chosenRow
			? choiceOf(chosenRow, sheet.chosenOnHand.get(chosenRow.id) ?? 0, today)
			: null,
		suggestion: suggested?.suggestion ?? null,
		suggestionNote: suggested?.note ?? null,
		verdict:
			line.actualUl === null
				? null
				: checkTolerance(requiredUl, line.actualUl, line.tolerancePercent)
	};
}

function componentSheetLine(
	line: BatchLine,
	source: RecipeLine,
	sheet: LoadedSheet,
	volumeL: number,
	reader: Reader,
	today: string
): SheetLine {
	const basis = sheet.components.get(source.componentId!)!;
	const shelf =
		source.shelfFormId && source.shelfFormId !== source.componentId
			? sheet.components.get(source.shelfFormId)!
			: null;
	const weighed = shelf ?? basis;
	const requirementLine = { amount: source.amount, unit: source.unit, component: basis, shelf };
	const chosenRow = line.lotId ? (sheet.chosenRows.get(line.lotId) ?? null) : null;
	const suggested = line.doneAt
		? null
		: suggestLot(requirementLine, weighed, volumeL, usableLots(weighed.id, reader, today), today);
	const forChosen = chosenRow ? requirementFor(requirementLine, volumeL, chosenRow, weighed) : null;
	const nominal =
		forChosen ?? suggested?.requirement ?? requirementFor(requirementLine, volumeL, null, weighed);
	const requiredUg = line.requiredUg ?? nominal.requiredUg;
	return {
		...baseOf(line, source, chosenRow),
		kind: 'component',
		name: weighed.name,
		basisName: shelf ? basis.name : null,
		componentId: weighed.id,
		stockRecipeId: null,
		formula: weighed.formula,
		requiredQuantity: requiredUg,
		requiredFor: forChosen ? 'chosen' : suggested?.requirement ? 'suggested' : 'nominal',
		requiredText: formatLineQuantity(requiredUg, 'component'),
		// The working ends in the unrounded mass ("weigh 4.01605 g"); the line's required text gives it
		// as the balance reads it, so the working stops before it.
		steps: nominal.steps.filter((step) => !step.startsWith('weigh ')),
		chosen: chosenRow
			? choiceOf(chosenRow, sheet.chosenOnHand.get(chosenRow.id) ?? 0, today)
			: null,
		suggestion: suggested?.suggestion ?? null,
		suggestionNote: suggested?.note ?? null,
		verdict:
			line.actualUg === null
				? null
				: checkTolerance(requiredUg, line.actualUg, line.tolerancePercent)
	};
}

/** The batch sheet: every line scaled to the batch volume and to the lot chosen or suggested. */
export function buildSheetLines(b: Batch, reader: Reader = db, today = isoToday()): SheetLine[] {
	const sheet = loadSheet(b, reader);
	const volumeL = batchVolumeL(b.targetVolumeMl);
	return sheet.lines.map((line) => {
		const source = sheet.recipeLines.get(line.recipeLineId)!;
		return line.kind === 'stock'
			? stockSheetLine(line, source, sheet, volumeL, reader, today)
			: componentSheetLine(line, source, sheet, volumeL, reader, today);
	});
}

export function phRange(targetPh: number | null): { min: number; max: number } | null {
	return targetPh === null
		? null
		: {
				min: Number((targetPh - DEFAULT_PH_TOLERANCE).toFixed(2)),
				max: Number((targetPh + DEFAULT_PH_TOLERANCE).toFixed(2))
			};
}
