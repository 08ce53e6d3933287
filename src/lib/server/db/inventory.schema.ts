import {
	index,
	integer,
	real,
	sqliteTable,
	text,
	uniqueIndex,
	type AnySQLiteColumn
} from 'drizzle-orm/sqlite-core';
import { batch } from './batches.schema';
import type { LedgerKind, LotStatus, QuantityKind, DateKind } from '$lib/inventory';
import { component } from './recipes.schema';
import { user } from './schema';
import { createdAt, id } from './columns';

/**
 * A received raw-material lot. Its stock is never stored here: on-hand is the sum of its ledger,
 * in the lot's base unit (mg for a mass, µL for a volume).
 */
export const lot = sqliteTable(
	'lot',
	{
		id: id(),
		/** The internal lot id printed on the label and scanned at the bench. */
		code: text('code').notNull().unique(),
		/** The raw material; null for a stock solution made here (see `sourceBatchId`). */
		componentId: text('component_id').references(() => component.id),
		/** The stock-solution batch this lot is, once it was released; null for a received lot. */
		sourceBatchId: text('source_batch_id').references((): AnySQLiteColumn => batch.id),
		supplier: text('supplier').notNull(),
		supplierLot: text('supplier_lot').notNull(),
		quantityKind: text('quantity_kind').$type<QuantityKind>().notNull(),
		/** The quantity as received, in the base unit, and the unit it was written in. */
		receivedQuantity: integer('received_quantity').notNull(),
		receivedUnit: text('received_unit').notNull(),
		receivedOn: text('received_on').notNull(),
		/** ISO date; `dateKind` says whether it is an expiry or a retest date. */
		expiresOn: text('expires_on').notNull(),
		dateKind: text('date_kind').$type<DateKind>().notNull().default('expiry'),
		/** ISO date from which the lot must be retested before use (set by a recall); null: none due. */
		retestOn: text('retest_on'),
		storage: text('storage').notNull().default(''),
		assayPercent: real('assay_percent'),
		purityPercent: real('purity_percent'),
		waterContentPercent: real('water_content_percent'),
		status: text('status').$type<LotStatus>().notNull().default('quarantine'),
		statusReason: text('status_reason').notNull().default(''),
		statusChangedAt: integer('status_changed_at', { mode: 'timestamp_ms' }),
		statusChangedById: text('status_changed_by_id').references(() => user.id),
		receivedById: text('received_by_id')
			.notNull()
			.references(() => user.id),
		note: text('note').notNull().default(''),
		createdAt: createdAt()
	},
	(t) => [
		uniqueIndex('lot_supplier_lot_idx').on(t.componentId, t.supplier, t.supplierLot),
		index('lot_component_idx').on(t.componentId),
		uniqueIndex('lot_source_batch_idx').on(t.sourceBatchId),
		index('lot_status_idx').on(t.status, t.expiresOn),
		index('lot_expiry_idx').on(t.expiresOn, t.code)
	]
);

/** A certificate of analysis (or other file) kept with a lot; the bytes live in the uploads folder. */
export const lotCertificate = sqliteTable(
	'lot_certificate',
	{
		id: id(),
		lotId: text('lot_id')
			.notNull()
			.references(() => lot.id),
		/** Random file name in the uploads folder; never derived from what the user sent. */
		storedName: text('stored_name').notNull().unique(),
		/** The name as uploaded, cleaned, for display and download only. */
		displayName: text('display_name').notNull(),
		mediaType: text('media_type').notNull(),
		sizeBytes: integer('size_bytes').notNull(),
		sha256: text('sha256').notNull(),
		uploadedById: text('uploaded_by_id')
			.notNull()
			.references(() => user.id),
		uploadedAt: createdAt()
	},
	(t) => [index('lot_certificate_lot_idx').on(t.lotId)]
);

/**
 * The stock ledger: append-only by trigger. Quantities are signed integers in the lot's base unit;
 * a trigger refuses an entry that would take the lot's sum below zero.
 */
export const stockEntry = sqliteTable(
	'stock_entry',
	{
		id: id(),
		lotId: text('lot_id')
			.notNull()
			.references(() => lot.id),
		kind: text('kind').$type<LedgerKind>().notNull(),
		quantity: integer('quantity').notNull(),
		reason: text('reason').notNull().default(''),
		/** The batch a consumption belongs to. */
		batchId: text('batch_id'),
		actorId: text('actor_id').references(() => user.id),
		at: integer('at', { mode: 'timestamp_ms' })
			.notNull()
			.$defaultFn(() => new Date())
	},
	(t) => [
		// (lot, at, id) and (at, id): a lot's ledger and the whole ledger in time order (entries of
		// one millisecond by id), read by keyset a page or an export chunk at a time. Not the rowid
		// for the tie: SQLite's row-value ranges cannot use it, and a bulk import's thousands of
		// entries of one millisecond made every chunk start its group again.
		index('stock_entry_lot_idx').on(t.lotId, t.at, t.id),
		index('stock_entry_at_idx').on(t.at, t.id),
		// Covers the on-hand sum: the ledger of a lot is summed from the index alone.
		index('stock_entry_lot_quantity_idx').on(t.lotId, t.quantity),
		index('stock_entry_batch_idx').on(t.batchId)
	]
);

/**
 * Each lot's stock on hand: the running sum of its ledger, kept by a trigger on every new ledger
 * entry (the ledger is append-only, so the sum stays exact) and never written by the app. Lists
 * read and sort by it instead of summing a site's ledger per request.
 */
export const lotOnHand = sqliteTable(
	'lot_on_hand',
	{
		lotId: text('lot_id')
			.primaryKey()
			.references(() => lot.id),
		quantity: integer('quantity').notNull()
	},
	(t) => [index('lot_on_hand_quantity_idx').on(t.quantity, t.lotId)]
);

/**
 * What the lot list sorts and filters on most, kept beside each lot by triggers (migration 0037):
 * its material's name (its component's, or for a stock made here its recipe's) and its status.
 * The list then sorts by material, whole or within one status, on an index instead of working the
 * name out and sorting every lot of a site.
 */
export const lotListKey = sqliteTable(
	'lot_list_key',
	{
		lotId: text('lot_id')
			.primaryKey()
			.references(() => lot.id),
		materialName: text('material_name').notNull(),
		code: text('code').notNull(),
		status: text('status').$type<LotStatus>().notNull()
	},
	(t) => [
		index('lot_list_key_material_idx').on(t.materialName, t.code, t.lotId),
		index('lot_list_key_status_material_idx').on(t.status, t.materialName, t.code, t.lotId)
	]
);

export type Lot = typeof lot.$inferSelect;
export type LotCertificate = typeof lotCertificate.$inferSelect;
export type StockEntry = typeof stockEntry.$inferSelect;

/** A recall: a signed act that holds a lot (or sends it to retest) and flags what was made from it. */
export const lotRecall = sqliteTable(
	'lot_recall',
	{
		id: id(),
		lotId: text('lot_id')
			.notNull()
			.references(() => lot.id),
		/** hold: back to quarantine; retest: not usable until retested. */
		lotAction: text('lot_action').$type<'hold' | 'retest'>().notNull(),
		reason: text('reason').notNull(),
		recalledById: text('recalled_by_id')
			.notNull()
			.references(() => user.id),
		signatureId: text('signature_id').notNull(),
		at: createdAt()
	},
	(t) => [index('lot_recall_lot_idx').on(t.lotId)]
);

/** A batch made from a recalled lot, at any depth through stocks. Append-only by trigger. */
export const batchRecallFlag = sqliteTable(
	'batch_recall_flag',
	{
		id: id(),
		recallId: text('recall_id')
			.notNull()
			.references(() => lotRecall.id),
		batchId: text('batch_id')
			.notNull()
			.references(() => batch.id),
		depth: integer('depth').notNull(),
		viaLotCode: text('via_lot_code')
	},
	(t) => [index('batch_recall_flag_batch_idx').on(t.batchId)]
);

export type LotRecall = typeof lotRecall.$inferSelect;
