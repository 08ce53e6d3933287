// A stock solution made here is a lot too: when a stock-solution batch is released, it becomes a
// lot kept by volume (its code is the batch number), which a later batch's stock line scans like a
// raw-material lot. Its volume leaves the ledger when that batch completes, and where-used and recall
// follow it from raw lot to stock to medium.
import { and, asc, eq } from 'drizzle-orm';
import { formatQuantity, isoToday, lotUnusability } from '$lib/inventory';
import { recordAudit, type Actor } from '../audit';
import { db, type Db } from '../db';
import { batch, lot, recipe, recipeVersion, type Batch, type Lot } from '../db/schema';
import { appendStockEntry, onHandColumn, type Tx } from '../inventory/ledger';
import { usableLotCondition } from '../inventory/usable';

type Reader = Pick<Db, 'select'>;

/** Stock kept without a shelf life on its recipe is given this many days (common practice). */
export const DEFAULT_STOCK_SHELF_LIFE_DAYS = 30;

function addDaysIso(isoDate: string, days: number): string {
	const date = new Date(`${isoDate}T00:00:00Z`);
	date.setUTCDate(date.getUTCDate() + days);
	return date.toISOString().slice(0, 10);
}

/**
 * At release of a stock-solution batch: its lot, released with it, expiring after the recipe
 * version's shelf life counted from the day it was prepared, and its volume received into the ledger.
 */
export function createStockLot(tx: Tx, actor: Actor & { id: string }, b: Batch): Lot | null {
	const made = tx
		.select({
			kind: recipe.kind,
			shelfLifeDays: recipeVersion.shelfLifeDays,
			storage: recipeVersion.storage
		})
		.from(recipeVersion)
		.innerJoin(recipe, eq(recipe.id, recipeVersion.recipeId))
		.where(eq(recipeVersion.id, b.versionId))
		.get();
	if (!made || made.kind !== 'stock_solution') return null;
	const preparedOn = (b.preparedAt ?? new Date()).toISOString().slice(0, 10);
	const shelfLifeDays = made.shelfLifeDays ?? DEFAULT_STOCK_SHELF_LIFE_DAYS;
	const volumeUl = b.targetVolumeMl * 1000;
	const row = tx
		.insert(lot)
		.values({
			code: b.number,
			componentId: null,
			sourceBatchId: b.id,
			supplier: 'Made here',
			supplierLot: b.number,
			quantityKind: 'volume',
			receivedQuantity: volumeUl,
			receivedUnit: 'mL',
			receivedOn: preparedOn,
			expiresOn: addDaysIso(preparedOn, shelfLifeDays),
			dateKind: 'expiry',
			storage: made.storage,
			status: 'released',
			statusReason: `Batch ${b.number} released at review`,
			statusChangedAt: new Date(),
			statusChangedById: actor.id,
			receivedById: b.preparedById ?? actor.id,
			note:
				made.shelfLifeDays === null
					? `The recipe gives no shelf life: ${DEFAULT_STOCK_SHELF_LIFE_DAYS} days assumed.`
					: ''
		})
		.returning()
		.get();
	appendStockEntry(tx, {
		lotId: row.id,
		kind: 'receipt',
		quantity: volumeUl,
		reason: `Made as batch ${b.number}`,
		batchId: b.id,
		actorId: actor.id
	});
	recordAudit(
		actor,
		{
			action: 'lot.made',
			subjectType: 'lot',
			subjectId: row.id,
			detail: { code: row.code, batch: b.number, expiresOn: row.expiresOn }
		},
		tx
	);
	return row;
}

/** The stock-solution recipe a made-here lot is, or null for a received lot. */
export function stockRecipeIdOfLot(lotRow: Lot, reader: Reader = db): string | null {
	if (!lotRow.sourceBatchId) return null;
	return (
		reader
			.select({ recipeId: batch.recipeId })
			.from(batch)
			.where(eq(batch.id, lotRow.sourceBatchId))
			.get()?.recipeId ?? null
	);
}

/** Released, in-date lots of a stock recipe, first-expiring first, with what each has on hand. */
export function usableStockLots(stockRecipeId: string, reader: Reader = db, today = isoToday()) {
	return reader
		.select({ row: lot, onHand: onHandColumn })
		.from(lot)
		.innerJoin(batch, eq(batch.id, lot.sourceBatchId))
		.where(and(eq(batch.recipeId, stockRecipeId), usableLotCondition(today)))
		.orderBy(asc(lot.expiresOn), asc(lot.code))
		.all();
}

/** Why this lot may not be the stock of a line, or null when it may. */
export function stockLotRefusal(
	lotRow: Lot,
	line: { stockRecipeId: string; name: string },
	neededUl: number,
	onHand: number,
	reader: Reader = db,
	today = isoToday()
): string | null {
	if (stockRecipeIdOfLot(lotRow, reader) !== line.stockRecipeId)
		return `Wrong stock: ${lotRow.code} is not ${line.name}; this line needs a released batch of ${line.name}.`;
	const unusable = lotUnusability(lotRow, today);
	if (unusable === 'quarantine' || unusable === 'rejected')
		return `Stock ${lotRow.code} is ${unusable === 'quarantine' ? 'on hold' : 'rejected'}, not released for use.`;
	if (unusable === 'expired')
		return `Stock ${lotRow.code} is expired: its expiry date was ${lotRow.expiresOn}.`;
	if (unusable === 'retest')
		return `Stock ${lotRow.code} is due for retest since ${lotRow.retestOn}; it may not be used until it is retested.`;
	if (onHand < neededUl)
		return `Stock ${lotRow.code} has ${formatQuantity(onHand, 'volume')} left; this line needs ${formatQuantity(neededUl, 'volume')}.`;
	return null;
}
