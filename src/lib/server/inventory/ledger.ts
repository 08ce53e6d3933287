import { and, asc, eq, sql } from 'drizzle-orm';
import { formatQuantity, type LedgerKind, type QuantityKind } from '$lib/inventory';
import { db, type Db } from '../db';
import { sqliteRefusal } from '../db/errors';
import { lot, lotOnHand, stockEntry, type StockEntry } from '../db/schema';
import { RuleError } from '../rule-error';

type Reader = Pick<Db, 'select'>;
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** A lot's stock on hand: its ledger's running sum, kept in `lot_on_hand` by a trigger. */
export function onHandOf(lotId: string, reader: Reader = db): number {
	const row = reader
		.select({ quantity: lotOnHand.quantity })
		.from(lotOnHand)
		.where(eq(lotOnHand.lotId, lotId))
		.get();
	return row?.quantity ?? 0;
}

/**
 * A lot's stock on hand as a column of any query over `lot`: its running ledger sum, which a
 * trigger keeps in `lot_on_hand` (one row per lot, read by its key), so no list sums the ledger
 * and no list of lot ids is bound as parameters (SQLite allows at most 32,766). Written with
 * table names: drizzle leaves columns unqualified in a single-table select.
 */
export const onHandColumn =
	sql<number>`coalesce((select loh.quantity from lot_on_hand loh where loh.lot_id = "lot"."id"), 0)`.mapWith(
		Number
	);

export function ledgerOf(lotId: string, reader: Reader = db): StockEntry[] {
	return reader
		.select()
		.from(stockEntry)
		.where(eq(stockEntry.lotId, lotId))
		.orderBy(asc(stockEntry.at), asc(stockEntry.id))
		.all();
}

export interface NewEntry {
	lotId: string;
	kind: LedgerKind;
	/** Signed, in the lot's base unit. */
	quantity: number;
	reason?: string;
	batchId?: string | null;
	actorId: string | null;
	at?: Date;
}

/**
 * Appends one ledger entry inside the caller's transaction. The application checks first, so the
 * user reads why; the database trigger refuses the same thing should two writers race.
 */
export function appendStockEntry(tx: Tx | Db, entry: NewEntry): StockEntry {
	if (!Number.isInteger(entry.quantity) || entry.quantity === 0) {
		throw new RuleError('A ledger entry needs a whole, non-zero quantity in the base unit.', {
			field: 'amount'
		});
	}
	const row = tx
		.select({ code: lot.code, quantityKind: lot.quantityKind })
		.from(lot)
		.where(eq(lot.id, entry.lotId))
		.get();
	if (!row) throw new RuleError('No lot with this id.', { status: 404 });
	const onHand = onHandOf(entry.lotId, tx);
	if (onHand + entry.quantity < 0) {
		throw new RuleError(
			`Lot ${row.code} has ${formatQuantity(onHand, row.quantityKind as QuantityKind)} on hand; taking ${formatQuantity(-entry.quantity, row.quantityKind as QuantityKind)} would make it negative. Nothing was taken.`,
			{ field: 'amount', status: 409 }
		);
	}
	if ((entry.kind === 'adjustment' || entry.kind === 'disposal') && !entry.reason?.trim()) {
		throw new RuleError(`Give the reason for the ${entry.kind}.`, { field: 'reason' });
	}
	try {
		return tx
			.insert(stockEntry)
			.values({
				lotId: entry.lotId,
				kind: entry.kind,
				quantity: entry.quantity,
				reason: entry.reason?.trim() ?? '',
				batchId: entry.batchId ?? null,
				actorId: entry.actorId,
				at: entry.at ?? new Date()
			})
			.returning()
			.get();
	} catch (cause) {
		if (sqliteRefusal(cause, /negative/)) {
			throw new RuleError(
				`Lot ${row.code} does not have enough on hand any more; nothing was taken.`,
				{ status: 409, field: 'amount' }
			);
		}
		throw cause;
	}
}

/** Every lot's on-hand next to its ledger sum: the two must always agree (used by tests and checks). */
export function ledgerSums(reader: Reader = db): { lotId: string; total: number }[] {
	return reader
		.select({ lotId: stockEntry.lotId, total: sql<number>`sum(${stockEntry.quantity})` })
		.from(stockEntry)
		.groupBy(stockEntry.lotId)
		.all()
		.map((r) => ({ lotId: r.lotId, total: Number(r.total) }));
}

export function entriesForBatch(batchId: string, reader: Reader = db): StockEntry[] {
	return reader
		.select()
		.from(stockEntry)
		.where(and(eq(stockEntry.batchId, batchId)))
		.orderBy(asc(stockEntry.at))
		.all();
}
