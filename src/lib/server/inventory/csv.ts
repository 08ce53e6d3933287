import { countOf } from '$lib/plural';
import { formatDateTime, formatIsoLocal } from '$lib/date-time';
import { siteTimeZone } from '../site-time-zone';
import { and, asc, eq, sql } from 'drizzle-orm';
import { formatQuantity, isoToday, type QuantityKind } from '$lib/inventory';
import { parseCsv, toCsv } from '../csv';
import { csvText, type CsvExport } from '../csv-export';
import { db } from '../db';
import { lot, lotListKey, stockEntry, user } from '../db/schema';
import { RuleError } from '../rule-error';
import { checkLotInput, type CheckedLot, type LotText } from './lot-input';
import type { LedgerCursor } from './ledger-page';
import { listLotsAfter, type LotExportKey, type LotRow } from './lot-list';
import { receiveLots, type SignedActor } from './lots';
import type { BatchLotUse, TracedUse } from './where-used';

/** CSV columns ↔ lot fields; the header row uses the snake_case names. */
const IMPORT_COLUMNS: Record<string, keyof LotText> = {
	component: 'component',
	supplier: 'supplier',
	supplier_lot: 'supplierLot',
	quantity: 'quantity',
	unit: 'unit',
	received_on: 'receivedOn',
	expires_on: 'expiresOn',
	date_kind: 'dateKind',
	storage: 'storage',
	assay_percent: 'assayPercent',
	purity_percent: 'purityPercent',
	water_content_percent: 'waterContentPercent',
	note: 'note'
};
/** A message names the file's own column, as the person sees it in their spreadsheet. */
const COLUMN_OF_FIELD: Record<string, string> = Object.fromEntries(
	Object.entries(IMPORT_COLUMNS).map(([column, field]) => [field, column])
);
const REQUIRED = [
	'component',
	'supplier',
	'supplier_lot',
	'quantity',
	'unit',
	'received_on',
	'expires_on'
];
export const LOT_IMPORT_TEMPLATE = `${Object.keys(IMPORT_COLUMNS).join(',')}\r\nsodium-chloride,Northfield Reagents,NR-24-0931,5,kg,${isoToday()},2029-06-30,expiry,Room temperature,99.8,,0.1,\r\n`;

export interface LotImportRow {
	rowNumber: number;
	values: Record<string, string>;
	errors: string[];
	value?: CheckedLot;
}

export interface LotImportPreview {
	rows: LotImportRow[];
	valid: number;
	invalid: number;
}

/** Checks every row as it would be received, including duplicates within the file itself. */
export function previewLotCsv(text: string, today = isoToday()): LotImportPreview {
	const table = parseCsv(text, { required: REQUIRED, allowed: Object.keys(IMPORT_COLUMNS) });
	if (table.rows.length === 0)
		throw new RuleError('The CSV has a header but no rows.', { field: 'csv' });
	if (table.rows.length > 1000)
		throw new RuleError('At most 1000 lots per import; split the file.', { field: 'csv' });
	const seen = new Map<string, number>();
	const rows = table.rows.map(({ rowNumber, values }) => {
		const input: LotText = {};
		for (const [column, field] of Object.entries(IMPORT_COLUMNS))
			input[field] = values[column] ?? '';
		const checked = checkLotInput(input, db, today);
		const errors = checked.ok
			? []
			: Object.entries(checked.fieldErrors).map(
					([field, messages]) => `${COLUMN_OF_FIELD[field] ?? field}: ${messages.join(' ')}`
				);
		if (checked.ok) {
			const key = [
				checked.value.componentId,
				checked.value.supplier.toLowerCase(),
				checked.value.supplierLot.toLowerCase()
			].join('|');
			const earlier = seen.get(key);
			if (earlier)
				errors.push(`supplier_lot: the same supplier lot is on row ${earlier} of this file.`);
			else seen.set(key, rowNumber);
		}
		return {
			rowNumber,
			values,
			errors,
			value: checked.ok && errors.length === 0 ? checked.value : undefined
		};
	});
	const invalid = rows.filter((r) => r.errors.length).length;
	return { rows, valid: rows.length - invalid, invalid };
}

/** All rows or none: any row with a problem refuses the whole file. */
export function importLotCsv(actor: SignedActor, text: string, today = isoToday()): number {
	const preview = previewLotCsv(text, today);
	if (preview.invalid) {
		throw new RuleError(
			`${preview.invalid} of ${countOf(preview.rows.length, 'row')} ${preview.invalid === 1 ? 'has a problem' : 'have problems'}; nothing was imported. Correct ${preview.invalid === 1 ? 'it' : 'them'} and preview again.`,
			{ field: 'csv' }
		);
	}
	return receiveLots(
		actor,
		preview.rows.map((r) => r.value!)
	).length;
}

const LOT_EXPORT_COLUMNS = [
	'lot_id',
	'component',
	'component_name',
	'supplier',
	'supplier_lot',
	'status',
	'expired',
	'received_on',
	'expires_on',
	'date_kind',
	'base_unit',
	'received_quantity',
	'on_hand',
	'on_hand_text',
	'storage',
	'assay_percent',
	'purity_percent',
	'water_content_percent'
] as const;

function lotExportRow(l: LotRow): unknown[] {
	const cells: Record<(typeof LOT_EXPORT_COLUMNS)[number], unknown> = {
		lot_id: l.code,
		component: l.componentId,
		component_name: l.componentName,
		supplier: l.supplier,
		supplier_lot: l.supplierLot,
		status: l.status,
		expired: l.expired ? 'yes' : 'no',
		received_on: l.receivedOn,
		expires_on: l.expiresOn,
		date_kind: l.dateKind,
		base_unit: l.quantityKind === 'mass' ? 'mg' : 'uL',
		received_quantity: l.receivedQuantity,
		on_hand: l.onHand,
		on_hand_text: formatQuantity(l.onHand, l.quantityKind),
		storage: l.storage,
		assay_percent: l.assayPercent ?? '',
		purity_percent: l.purityPercent ?? '',
		water_content_percent: l.waterContentPercent ?? ''
	};
	return LOT_EXPORT_COLUMNS.map((c) => cells[c] ?? '');
}

/** Every lot, first to expire first, read a chunk at a time. */
export function lotsExport(today = isoToday()): CsvExport<LotExportKey> {
	return {
		columns: LOT_EXPORT_COLUMNS,
		comments: [
			`Lots at Pilot Plant North, exported ${formatDateTime(new Date(), siteTimeZone())}. Quantities are integers in the base unit (mg or uL).`
		],
		read: (after, limit) => {
			const lots = listLotsAfter(after, limit, today);
			const last = lots.at(-1);
			return {
				rows: lots.map(lotExportRow),
				last: last ? { expiresOn: last.expiresOn, code: last.code } : null
			};
		}
	};
}

export function exportLotsCsv(today = isoToday()): string {
	return csvText(lotsExport(today));
}

const LEDGER_EXPORT_COLUMNS = [
	'at',
	'lot_id',
	'component',
	'kind',
	'quantity',
	'base_unit',
	'quantity_text',
	'reason',
	'batch_id',
	'by'
];

type LedgerExportKey = LedgerCursor;

/** The ledger (of one lot, or all of it) in the order recorded, read a chunk at a time. */
export function ledgerExport(lotId?: string): CsvExport<LedgerExportKey> {
	const timeZone = siteTimeZone();
	return {
		columns: LEDGER_EXPORT_COLUMNS,
		comments: ['Stock ledger: append-only. On-hand of a lot is the sum of its quantities.'],
		read: (after, limit) => {
			const conditions = [
				lotId ? eq(stockEntry.lotId, lotId) : undefined,
				after ? sql`(${stockEntry.at}, ${stockEntry.id}) > (${after.atMs}, ${after.id})` : undefined
			];
			// The chunk is cut from the ledger's own (at, id) order first, in a subquery the planner
			// cannot flatten; joined in one query, SQLite chose to sort the whole ledger per chunk.
			const chunk = db
				.select()
				.from(stockEntry)
				.where(and(...conditions))
				.orderBy(asc(stockEntry.at), asc(stockEntry.id))
				.limit(limit)
				.as('chunk');
			const entries = db
				.select({
					id: chunk.id,
					at: chunk.at,
					lotCode: lot.code,
					material: lotListKey.materialName,
					kind: chunk.kind,
					quantity: chunk.quantity,
					quantityKind: lot.quantityKind,
					reason: chunk.reason,
					batchId: chunk.batchId,
					actor: user.email
				})
				.from(chunk)
				.innerJoin(lot, eq(chunk.lotId, lot.id))
				.innerJoin(lotListKey, eq(lotListKey.lotId, lot.id))
				.leftJoin(user, eq(chunk.actorId, user.id))
				.orderBy(asc(chunk.at), asc(chunk.id))
				.all();
			const last = entries.at(-1);
			return {
				rows: entries.map((e) => [
					formatIsoLocal(e.at, timeZone),
					e.lotCode,
					e.material,
					e.kind,
					e.quantity,
					e.quantityKind === 'mass' ? 'mg' : 'uL',
					formatQuantity(e.quantity, e.quantityKind as QuantityKind),
					e.reason,
					e.batchId ?? '',
					e.actor ?? ''
				]),
				last: last ? { atMs: last.at.getTime(), id: last.id } : null
			};
		}
	};
}

export function exportLedgerCsv(lotId?: string): string {
	return csvText(ledgerExport(lotId));
}

export function whereUsedCsv(lotCode: string, uses: TracedUse[]): string {
	return toCsv(
		uses.map((u) => ({
			lot_id: lotCode,
			batch: u.batchNumber,
			depth: u.depth,
			via_stock: u.viaLotCode ?? '',
			state: u.state,
			recipe: u.recipeName,
			planned_on: u.plannedOn,
			prepared_at: u.preparedAt ? formatIsoLocal(u.preparedAt, siteTimeZone()) : '',
			intended_use: u.intendedUse,
			line: u.position,
			consumed: u.consumedQuantity ?? '',
			consumed_text:
				u.consumedQuantity === null ? '' : formatQuantity(u.consumedQuantity, u.quantityKind)
		})),
		[
			'lot_id',
			'batch',
			'depth',
			'via_stock',
			'state',
			'recipe',
			'planned_on',
			'prepared_at',
			'intended_use',
			'line',
			'consumed',
			'consumed_text'
		],
		[`Where lot ${lotCode} was used. Quantities in the lot's base unit (mg or uL).`]
	);
}

export function batchLotsCsv(batchNumber: string, uses: BatchLotUse[]): string {
	return toCsv(
		uses.map((u) => ({
			batch: batchNumber,
			line: u.position,
			lot_id: u.lotCode,
			component: u.componentName,
			supplier: u.supplier,
			supplier_lot: u.supplierLot,
			expires_on: u.expiresOn,
			lot_status: u.lotStatus,
			consumed: u.consumedQuantity ?? '',
			consumed_text:
				u.consumedQuantity === null ? '' : formatQuantity(u.consumedQuantity, u.quantityKind)
		})),
		[
			'batch',
			'line',
			'lot_id',
			'component',
			'supplier',
			'supplier_lot',
			'expires_on',
			'lot_status',
			'consumed',
			'consumed_text'
		],
		[`Lots used by batch ${batchNumber}.`]
	);
}
