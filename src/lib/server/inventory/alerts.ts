import { and, eq, isNotNull, sql } from 'drizzle-orm';
import { DEFAULT_EXPIRY_WINDOW_DAYS, isoToday } from '$lib/inventory';
import { db, type Db } from '../db';
import { component, lot, lotOnHand } from '../db/schema';
import { listLots, listLotsPage, type LotRow } from './lot-list';
import { lotQuantityToGrams } from './units';
import { usableLotCondition } from './usable';

type Reader = Pick<Db, 'select'>;

export function addDays(isoDate: string, days: number): string {
	const date = new Date(`${isoDate}T00:00:00Z`);
	date.setUTCDate(date.getUTCDate() + days);
	return date.toISOString().slice(0, 10);
}

export interface ExpiringLot extends LotRow {
	daysLeft: number;
}

/** How many expiring lots the inventory page and the digest list; the rest are counted. */
export const EXPIRING_LISTED = 100;
/**
 * The inventory page counts expiring lots up to this and then says "more than": a count of every
 * in-stock lot of a large site reads each one (90 ms at 80,000), and the page links to the full list.
 */
export const EXPIRING_COUNTED_UP_TO = 1000;

/**
 * Lots with stock that are not rejected and whose date falls within `days` (already expired
 * included), first to expire first: the first `listed` of them and how many there are in all.
 */
export function expiringLots(
	days = DEFAULT_EXPIRY_WINDOW_DAYS,
	today = isoToday(),
	reader: Reader = db,
	{ listed = EXPIRING_LISTED, countUpTo }: { listed?: number; countUpTo?: number } = {}
): { lots: ExpiringLot[]; total: number; moreThanTotal: boolean; before: string } {
	const before = addDays(today, days);
	const { rows, total } = listLotsPage(
		{ expiringBefore: before, notStatus: 'rejected', inStockOnly: true },
		{ page: 1, limit: listed, sort: 'expiresOn', dir: 'asc' },
		today,
		reader,
		countUpTo === undefined ? undefined : countUpTo + 1
	);
	const lots = rows.map((l) => ({
		...l,
		daysLeft: Math.round((Date.parse(l.expiresOn) - Date.parse(today)) / 86_400_000)
	}));
	const moreThanTotal = countUpTo !== undefined && total > countUpTo;
	return { lots, total: moreThanTotal ? countUpTo : total, moreThanTotal, before };
}

export interface LowComponent {
	componentId: string;
	componentName: string;
	reorderLevelG: number;
	/** Released, in-date stock in grams: what batches can actually use. */
	usableG: number;
	lots: number;
}

/** Components whose released, in-date stock is below their reorder level. */
export function componentsBelowReorder(today = isoToday(), reader: Reader = db): LowComponent[] {
	const withLevel = reader
		.select({
			id: component.id,
			name: component.name,
			reorderLevelG: component.reorderLevelG,
			densityGPerMl: component.densityGPerMl
		})
		.from(component)
		.where(isNotNull(component.reorderLevelG))
		.all();
	if (withLevel.length === 0) return [];
	// Summed in SQL per component and unit kind: a site's lots are never all loaded for this.
	const stock = reader
		.select({
			componentId: lot.componentId,
			quantityKind: lot.quantityKind,
			onHand: sql<number>`sum(${lotOnHand.quantity})`.mapWith(Number),
			lots: sql<number>`sum(${lotOnHand.quantity} > 0)`.mapWith(Number)
		})
		.from(lot)
		.innerJoin(component, eq(component.id, lot.componentId))
		.innerJoin(lotOnHand, eq(lotOnHand.lotId, lot.id))
		.where(and(isNotNull(component.reorderLevelG), usableLotCondition(today)))
		.groupBy(lot.componentId, lot.quantityKind)
		.all();
	return withLevel
		.map((c) => {
			const own = stock.filter((s) => s.componentId === c.id);
			const usableG = own.reduce(
				(sum, s) => sum + (lotQuantityToGrams(s.onHand, s.quantityKind, c.densityGPerMl) ?? 0),
				0
			);
			return {
				componentId: c.id,
				componentName: c.name,
				reorderLevelG: c.reorderLevelG!,
				usableG,
				lots: own.reduce((n, s) => n + s.lots, 0)
			};
		})
		.filter((c) => c.usableG < c.reorderLevelG)
		.sort((a, b) => a.componentName.localeCompare(b.componentName));
}

export function quarantinedLots(today = isoToday(), reader: Reader = db): LotRow[] {
	return listLots({ status: 'quarantine' }, today, reader);
}

export function componentsWithStockSettings(reader: Reader = db) {
	return reader
		.select({
			id: component.id,
			name: component.name,
			reorderLevelG: component.reorderLevelG,
			densityGPerMl: component.densityGPerMl
		})
		.from(component)
		.orderBy(component.name)
		.all();
}
