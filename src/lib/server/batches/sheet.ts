import { and, asc, eq, inArray } from 'drizzle-orm';
import { checkTolerance, DEFAULT_PH_TOLERANCE } from '$lib/batches';
import { isExpired, isoToday, type QuantityKind } from '$lib/inventory';
import { findComponentsByIds } from '../components/library';
import { db, type Db } from '../db';
import { batchLine, lot, recipeLine, type Batch, type BatchLine, type Component, type Lot } from '../db/schema';
import { onHandByLot } from '../inventory/ledger';
import { usableLotCondition } from '../inventory/usable';
import { massToLotQuantity } from '../inventory/units';
import { findRecipe } from '../recipes/queries';
import { scaleComponentLine, scaleStockLine } from './scaling';

type Reader = Pick<Db, 'select'>;

import type { LotChoice, SheetLine } from '$lib/batches';

export type { LotChoice, SheetLine };

/** Shown to the resolution a bench balance reads: 1 mg up to a kilogram, then 0.1 g. */
export function formatMassUg(ug: number): string {
	const g = ug / 1e6;
	if (g >= 1000) return `${Number(g.toFixed(1))} g`;
	if (g >= 1) return `${Number(g.toFixed(3))} g`;
	return `${Number((ug / 1000).toPrecision(4))} mg`;
}

export function formatVolumeUl(ul: number): string {
	return ul >= 1000 ? `${Number((ul / 1000).toPrecision(6))} mL` : `${Number(ul.toPrecision(4))} µL`;
}

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

/** Required µg for one lot, and that mass in the lot's base unit (for the stock check). */
export function requirementFor(
	line: { amount: number; unit: string; component: Component; shelf: Component | null },
	volumeL: number,
	lotRow: Pick<Lot, 'assayPercent' | 'waterContentPercent' | 'quantityKind'> | null,
	weighed: Component
) {
	const scaled = scaleComponentLine({ amount: line.amount, unit: line.unit, component: line.component, shelfForm: line.shelf }, volumeL, lotRow);
	const requiredUg = Math.round(scaled.massG * 1e6);
	const inLotUnits = lotRow ? Math.max(1, massToLotQuantity(scaled.massG, lotRow, weighed)) : null;
	return { requiredUg, inLotUnits, steps: scaled.steps };
}

/** Released, in-date lots of a component, first-expired first (FEFO), then first received. */
export function usableLots(componentId: string, reader: Reader = db, today = isoToday()): { row: Lot; onHand: number }[] {
	const rows = reader
		.select()
		.from(lot)
		.where(and(eq(lot.componentId, componentId), usableLotCondition(today)))
		.orderBy(asc(lot.expiresOn), asc(lot.receivedOn), asc(lot.code))
		.all();
	const onHand = onHandByLot(rows.map((r) => r.id), reader);
	return rows.map((row) => ({ row, onHand: onHand.get(row.id) ?? 0 }));
}

/** The batch sheet: every line scaled to the batch volume and to the lot chosen or suggested. */
export function buildSheetLines(b: Batch, reader: Reader = db, today = isoToday()): SheetLine[] {
	const lines = reader.select().from(batchLine).where(eq(batchLine.batchId, b.id)).orderBy(asc(batchLine.position)).all();
	const recipeLines = new Map(
		lines.length
			? reader
					.select()
					.from(recipeLine)
					.where(inArray(recipeLine.id, lines.map((l) => l.recipeLineId)))
					.all()
					.map((r) => [r.id, r])
			: []
	);
	const components = findComponentsByIds(
		[...recipeLines.values()].flatMap((r) => [r.componentId ?? '', r.shelfFormId ?? '']),
		reader
	);
	const chosenIds = lines.map((l) => l.lotId).filter((id): id is string => Boolean(id));
	const chosenRows = new Map(chosenIds.length ? reader.select().from(lot).where(inArray(lot.id, chosenIds)).all().map((l) => [l.id, l]) : []);
	const chosenOnHand = onHandByLot(chosenIds, reader);
	const volumeL = b.targetVolumeMl / 1000;

	return lines.map((line: BatchLine): SheetLine => {
		const source = recipeLines.get(line.recipeLineId)!;
		const base = {
			id: line.id,
			position: line.position,
			kind: line.kind,
			amount: source.amount,
			unit: source.unit,
			note: source.note,
			tolerancePercent: line.tolerancePercent,
			actualQuantity: line.actualQuantity,
			actualText: line.actualText,
			doneAt: line.doneAt,
			doneById: line.doneById,
			stockSource: line.stockSource,
			consumedQuantity: line.consumedQuantity
		};
		if (line.kind === 'stock') {
			const scaled = scaleStockLine(source.amount, volumeL);
			const requiredUl = Math.round(scaled.volumeMl * 1000);
			return {
				...base,
				kind: 'stock',
				name: findRecipe(source.stockRecipeId!, reader)?.name ?? 'Stock solution',
				basisName: null,
				componentId: null,
				formula: null,
				requiredQuantity: requiredUl,
				requiredFor: 'nominal',
				requiredText: formatVolumeUl(requiredUl),
				steps: scaled.steps,
				chosen: null,
				suggestion: null,
				suggestionNote: null,
				verdict: line.actualQuantity === null ? null : checkTolerance(requiredUl, line.actualQuantity, line.tolerancePercent)
			};
		}
		const basis = components.get(source.componentId!)!;
		const shelf = source.shelfFormId && source.shelfFormId !== source.componentId ? components.get(source.shelfFormId)! : null;
		const weighed = shelf ?? basis;
		const requirementInput = { amount: source.amount, unit: source.unit, component: basis, shelf };
		const chosenRow = line.lotId ? chosenRows.get(line.lotId) ?? null : null;
		let suggestion: LotChoice | null = null;
		let suggestionNote: string | null = null;
		let suggested: ReturnType<typeof requirementFor> | null = null;
		if (!line.doneAt) {
			const candidates = usableLots(weighed.id, reader, today);
			for (const candidate of candidates) {
				const need = requirementFor(requirementInput, volumeL, candidate.row, weighed);
				if (candidate.onHand >= (need.inLotUnits ?? 0)) {
					suggestion = choiceOf(candidate.row, candidate.onHand, today);
					suggested = need;
					break;
				}
			}
			if (!suggestion) {
				suggestionNote = candidates.length
					? `No released, in-date lot of ${weighed.name} has enough on hand for this line.`
					: `No released, in-date lot of ${weighed.name} is in stock.`;
			}
		}
		const forChosen = chosenRow ? requirementFor(requirementInput, volumeL, chosenRow, weighed) : null;
		const nominal = forChosen ?? suggested ?? requirementFor(requirementInput, volumeL, null, weighed);
		const requiredQuantity = line.requiredQuantity ?? nominal.requiredUg;
		return {
			...base,
			kind: 'component',
			name: weighed.name,
			basisName: shelf ? basis.name : null,
			componentId: weighed.id,
			formula: weighed.formula,
			requiredQuantity,
			requiredFor: forChosen ? 'chosen' : suggested ? 'suggested' : 'nominal',
			requiredText: formatMassUg(requiredQuantity),
			steps: nominal.steps,
			chosen: chosenRow ? choiceOf(chosenRow, chosenOnHand.get(chosenRow.id) ?? 0, today) : null,
			suggestion,
			suggestionNote,
			verdict: line.actualQuantity === null ? null : checkTolerance(requiredQuantity, line.actualQuantity, line.tolerancePercent)
		};
	});
}

export function phRange(targetPh: number | null): { min: number; max: number } | null {
	return targetPh === null ? null : { min: Number((targetPh - DEFAULT_PH_TOLERANCE).toFixed(2)), max: Number((targetPh + DEFAULT_PH_TOLERANCE).toFixed(2)) };
}

