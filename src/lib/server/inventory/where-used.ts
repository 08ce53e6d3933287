import { and, asc, eq, isNotNull, sql } from 'drizzle-orm';
import type { BatchState } from '$lib/batches';
import type { QuantityKind } from '$lib/inventory';
import { db, type Db } from '../db';
import { batch, batchLine, component, lot, recipe } from '../db/schema';

type Reader = Pick<Db, 'select'>;

/** Taken from the lot, in its base unit as the ledger keeps it: mg by mass, µL by volume (`quantityKind`). */
const consumedInLotUnit = sql<
	number | null
>`coalesce(${batchLine.consumedMg}, ${batchLine.consumedUl})`;

export interface LotUse {
	batchId: string;
	batchNumber: string;
	state: BatchState;
	recipeName: string;
	plannedOn: string;
	preparedAt: Date | null;
	intendedUse: string;
	position: number;
	/** Taken from the lot in its base unit (mg or µL by quantityKind); null while the batch is not yet prepared. */
	consumedQuantity: number | null;
	quantityKind: QuantityKind;
}

/** Every batch that chose this lot for a line: consumed once prepared, reserved while in preparation. */
export function batchesUsingLot(lotId: string, reader: Reader = db): LotUse[] {
	return reader
		.select({
			batchId: batch.id,
			batchNumber: batch.number,
			state: batch.state,
			recipeName: recipe.name,
			plannedOn: batch.plannedOn,
			preparedAt: batch.preparedAt,
			intendedUse: batch.intendedUse,
			position: batchLine.position,
			consumedQuantity: consumedInLotUnit,
			quantityKind: lot.quantityKind
		})
		.from(batchLine)
		.innerJoin(batch, eq(batchLine.batchId, batch.id))
		.innerJoin(recipe, eq(batch.recipeId, recipe.id))
		.innerJoin(lot, eq(batchLine.lotId, lot.id))
		.where(eq(batchLine.lotId, lotId))
		.orderBy(asc(batch.number), asc(batchLine.position))
		.all();
}

export interface TracedUse extends LotUse {
	/** 1 for a batch that used the lot itself; 2 for one that used a stock made with it; and so on. */
	depth: number;
	/** The stock lot (a batch number) this use came through; null at depth 1. */
	viaLotCode: string | null;
}

/** Deepest chain of stocks followed: stocks of stocks are rare beyond two or three. */
const MAX_TRACE_DEPTH = 10;

/**
 * Every batch made from the lot at any depth: the batches that used it, then those that used a
 * stock solution made by one of them, and so on. Each batch appears once, at its shallowest depth.
 */
export function batchesMadeFromLot(lotId: string, reader: Reader = db): TracedUse[] {
	const traced: TracedUse[] = [];
	const seenBatches = new Set<string>();
	let frontier: { lotId: string; viaLotCode: string | null }[] = [{ lotId, viaLotCode: null }];
	for (let depth = 1; frontier.length > 0 && depth <= MAX_TRACE_DEPTH; depth++) {
		const next: typeof frontier = [];
		for (const source of frontier) {
			for (const use of batchesUsingLot(source.lotId, reader)) {
				if (seenBatches.has(use.batchId)) continue;
				seenBatches.add(use.batchId);
				traced.push({ ...use, depth, viaLotCode: source.viaLotCode });
				const made = reader
					.select({ id: lot.id, code: lot.code })
					.from(lot)
					.where(eq(lot.sourceBatchId, use.batchId))
					.get();
				if (made) next.push({ lotId: made.id, viaLotCode: made.code });
			}
		}
		frontier = next;
	}
	return traced;
}

/** What a lot holds, for lists: the component's name, or the stock recipe's for a lot made here. */
const lotMaterialName = sql<string>`coalesce(${component.name}, (select r.name from recipe r join batch b on b.recipe_id = r.id where b.id = ${lot.sourceBatchId}), ${lot.code})`;

export interface BatchLotUse {
	position: number;
	lotId: string;
	lotCode: string;
	componentName: string;
	supplier: string;
	supplierLot: string;
	expiresOn: string;
	lotStatus: string;
	consumedQuantity: number | null;
	quantityKind: QuantityKind;
}

/** Every lot a batch used, in its order of addition. */
export function lotsUsedByBatch(batchId: string, reader: Reader = db): BatchLotUse[] {
	return reader
		.select({
			position: batchLine.position,
			lotId: lot.id,
			lotCode: lot.code,
			componentName: lotMaterialName,
			supplier: lot.supplier,
			supplierLot: lot.supplierLot,
			expiresOn: lot.expiresOn,
			lotStatus: lot.status,
			consumedQuantity: consumedInLotUnit,
			quantityKind: lot.quantityKind
		})
		.from(batchLine)
		.innerJoin(lot, eq(batchLine.lotId, lot.id))
		.leftJoin(component, eq(lot.componentId, component.id))
		.where(and(eq(batchLine.batchId, batchId), isNotNull(batchLine.lotId)))
		.orderBy(asc(batchLine.position))
		.all();
}

/** Batches whose medium may be in use and so need action first when a lot is recalled. */
export const RECALL_ATTENTION: readonly BatchState[] = ['released', 'prepared', 'in_preparation'];
