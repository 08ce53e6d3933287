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
			componentName: component.name,
			supplier: lot.supplier,
			supplierLot: lot.supplierLot,
			expiresOn: lot.expiresOn,
			lotStatus: lot.status,
			consumedQuantity: consumedInLotUnit,
			quantityKind: lot.quantityKind
		})
		.from(batchLine)
		.innerJoin(lot, eq(batchLine.lotId, lot.id))
		.innerJoin(component, eq(lot.componentId, component.id))
		.where(and(eq(batchLine.batchId, batchId), isNotNull(batchLine.lotId)))
		.orderBy(asc(batchLine.position))
		.all();
}

/** Batches whose medium may be in use and so need action first when a lot is recalled. */
export const RECALL_ATTENTION: readonly BatchState[] = ['released', 'prepared', 'in_preparation'];
