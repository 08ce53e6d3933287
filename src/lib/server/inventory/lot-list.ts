import { and, asc, count, eq, inArray, lte, ne, sql, type SQL } from 'drizzle-orm';
import { isExpired, isoToday, type LotStatus, type QuantityKind } from '$lib/inventory';
import { db, type Db } from '../db';
import { component, lot, lotListKey, lotOnHand } from '../db/schema';
import {
	cursorOf,
	keysetPageOf,
	rowsAfter,
	sortValueOf,
	type KeysetCursor,
	type KeysetPage,
	type KeysetQuery
} from '../keyset';
import {
	offsetOf,
	orderFor,
	sortKeys,
	type ListPage,
	type Paging,
	type SortDirection
} from '../list-paging';
import { searchMatch } from '../search-match';
import { onHandColumn } from './ledger';

type Reader = Pick<Db, 'select'>;

export interface LotFilter {
	componentId?: string;
	status?: LotStatus;
	/** Lots whose expiry or retest date is on or before this date. */
	expiringBefore?: string;
	search?: string;
	/** Leave out lots in this status (rejected lots for the expiry alerts). */
	notStatus?: LotStatus;
	/** Only lots with stock on hand. */
	inStockOnly?: boolean;
}

export interface LotRow {
	id: string;
	code: string;
	/** Null for a stock solution made here; `componentName` is then the stock recipe's name. */
	componentId: string | null;
	componentName: string;
	supplier: string;
	supplierLot: string;
	quantityKind: QuantityKind;
	receivedQuantity: number;
	onHand: number;
	receivedOn: string;
	expiresOn: string;
	retestOn: string | null;
	dateKind: string;
	storage: string;
	status: LotStatus;
	expired: boolean;
	assayPercent: number | null;
	purityPercent: number | null;
	waterContentPercent: number | null;
}

const LOT_SORT_COLUMNS = {
	code: lot.code,
	// The material's name as lot_material_name keeps it: a stock made here is named after its recipe.
	component: lotListKey.materialName,
	// Supplier, then their lot number (unit separator between: no name contains it).
	supplier: sql`${lot.supplier} || char(31) || ${lot.supplierLot}`,
	status: lot.status,
	onHand: lotOnHand.quantity,
	expiresOn: lot.expiresOn,
	receivedOn: lot.receivedOn
} as const;

export const LOT_SORTS = sortKeys(LOT_SORT_COLUMNS);
export type LotSort = keyof typeof LOT_SORT_COLUMNS;

function lotConditions(filter: LotFilter): SQL | undefined {
	const conditions: SQL[] = [];
	if (filter.componentId) conditions.push(eq(lot.componentId, filter.componentId));
	if (filter.status) conditions.push(eq(lot.status, filter.status));
	if (filter.expiringBefore) conditions.push(lte(lot.expiresOn, filter.expiringBefore));
	if (filter.notStatus) conditions.push(ne(lot.status, filter.notStatus));
	if (filter.inStockOnly) conditions.push(sql`${onHandColumn} > 0`);
	if (filter.search) {
		conditions.push(
			searchMatch(
				lot.id,
				{ table: 'lot_search', idColumn: 'lot_id' },
				filter.search,
				(term) =>
					sql`(lower(${lot.code}) like ${term} or lower(${lot.supplier}) like ${term} or lower(${lot.supplierLot}) like ${term} or lower(${component.name}) like ${term})`
			)
		);
	}
	return conditions.length ? and(...conditions) : undefined;
}

function selectLots<E extends Record<string, SQL>>(reader: Reader, extra: E = {} as E) {
	return reader
		.select({
			...extra,
			id: lot.id,
			code: lot.code,
			componentId: lot.componentId,
			componentName: sql<string>`coalesce(${lotListKey.materialName}, ${lot.code})`,
			supplier: lot.supplier,
			supplierLot: lot.supplierLot,
			quantityKind: lot.quantityKind,
			receivedQuantity: lot.receivedQuantity,
			onHand: sql<number>`coalesce(${lotOnHand.quantity}, 0)`.mapWith(Number),
			receivedOn: lot.receivedOn,
			expiresOn: lot.expiresOn,
			retestOn: lot.retestOn,
			dateKind: lot.dateKind,
			storage: lot.storage,
			status: lot.status,
			assayPercent: lot.assayPercent,
			purityPercent: lot.purityPercent,
			waterContentPercent: lot.waterContentPercent
		})
		.from(lot)
		.leftJoin(component, eq(lot.componentId, component.id))
		.leftJoin(lotOnHand, eq(lotOnHand.lotId, lot.id))
		.leftJoin(lotListKey, eq(lotListKey.lotId, lot.id));
}

type SelectedLot = Omit<LotRow, 'expired'>;
const withExpiry =
	(today: string) =>
	<R extends SelectedLot>(r: R) => ({
		...r,
		expired: isExpired(r.expiresOn, today)
	});

export interface LotExportKey {
	expiresOn: string;
	code: string;
}

/**
 * The next `limit` lots after `after` in export order (first to expire first, then by code): a
 * keyset read on the (expires_on, code) index, so each chunk costs the same however deep.
 */
export function listLotsAfter(
	after: LotExportKey | null,
	limit: number,
	today = isoToday(),
	reader: Reader = db
): LotRow[] {
	return selectLots(reader)
		.where(
			after ? sql`(${lot.expiresOn}, ${lot.code}) > (${after.expiresOn}, ${after.code})` : undefined
		)
		.orderBy(asc(lot.expiresOn), asc(lot.code))
		.limit(limit)
		.all()
		.map(withExpiry(today));
}

/** Every lot the filter matches, first to expire first: for exports and the digest. */
export function listLots(
	filter: LotFilter = {},
	today = isoToday(),
	reader: Reader = db
): LotRow[] {
	return selectLots(reader)
		.where(lotConditions(filter))
		.orderBy(asc(lot.expiresOn), asc(lot.code))
		.all()
		.map(withExpiry(today));
}

/**
 * The ids of the lots the filter matches (after the cursor's row, when given) in the list's order,
 * for the page and the cursor entry alike: found from only what the filter and the order need, so
 * a page skips rows without building them (a deferred join); the full rows are read after.
 */
function lotIdsInOrder(
	filter: LotFilter,
	sort: LotSort,
	dir: SortDirection,
	reader: Reader,
	cursor?: KeysetCursor
) {
	// By stock or by material: walk the (quantity, lot_id) or (status, material, code) index of the
	// table kept beside the lots; every lot has its row in both. With no filter but the status, the
	// material order is read from lot_list_key alone.
	const byStock = sort === 'onHand';
	const byMaterial = sort === 'component';
	const tieBreaker = byStock ? lotOnHand.lotId : byMaterial ? lotListKey.code : lot.code;
	const order = orderFor(LOT_SORT_COLUMNS[sort], dir, tieBreaker);
	const ids = byStock
		? reader
				.select({ id: lotOnHand.lotId })
				.from(lotOnHand)
				.innerJoin(lot, eq(lot.id, lotOnHand.lotId))
				.leftJoin(component, eq(lot.componentId, component.id))
		: byMaterial
			? filtersOnlyStatus(filter)
				? reader.select({ id: lotListKey.lotId }).from(lotListKey)
				: reader
						.select({ id: lotListKey.lotId })
						.from(lotListKey)
						.innerJoin(lot, eq(lot.id, lotListKey.lotId))
						.leftJoin(component, eq(lot.componentId, component.id))
			: filter.search
				? reader
						.select({ id: lot.id })
						.from(lot)
						.leftJoin(component, eq(lot.componentId, component.id))
				: reader.select({ id: lot.id }).from(lot);
	const where =
		byMaterial && filtersOnlyStatus(filter)
			? filter.status
				? eq(lotListKey.status, filter.status)
				: undefined
			: lotConditions(filter);
	const after = cursor ? rowsAfter(LOT_SORT_COLUMNS[sort], tieBreaker, cursor) : undefined;
	return { ids: ids.where(and(where, after)).orderBy(...order), order };
}

/** One page of the lots the filter matches, sorted as asked, with the count of all of them. */
export function listLotsPage(
	filter: LotFilter,
	paging: Paging<LotSort>,
	today = isoToday(),
	reader: Reader = db,
	/** count no further than this: the total is then "at least" (a panel that links to the full list) */
	countUpTo?: number
): ListPage<LotRow> {
	const { ids, order } = lotIdsInOrder(filter, paging.sort, paging.dir, reader);
	const rows = selectLots(reader)
		.where(inArray(lot.id, ids.limit(paging.limit).offset(offsetOf(paging))))
		.orderBy(...order)
		.all()
		.map(withExpiry(today));
	return { rows, total: countLots(filter, reader, countUpTo) };
}

/**
 * The lots after the query's cursor (the first ones without), sorted as asked, with the count of
 * all the filter matches and the cursor of the next page: the API's list.
 */
export function listLotsByCursor(
	filter: LotFilter,
	query: KeysetQuery<LotSort>,
	today = isoToday(),
	reader: Reader = db
): KeysetPage<LotRow> {
	const { ids, order } = lotIdsInOrder(filter, query.sort, query.dir, reader, cursorOf(query));
	const rowsRead = selectLots(reader, { sortValue: sortValueOf(LOT_SORT_COLUMNS[query.sort]) })
		.where(inArray(lot.id, ids.limit(query.limit + 1)))
		.orderBy(...order)
		.all()
		.map(withExpiry(today));
	// The tie-breaker of lotIdsInOrder: the lot's id by stock, else its code.
	return keysetPageOf(rowsRead, query, countLots(filter, reader), (row) =>
		query.sort === 'onHand' ? row.id : row.code
	);
}

/** Whether the filter asks for nothing but (at most) a status; any other field, even a new one, counts. */
function filtersOnlyStatus(filter: LotFilter): boolean {
	return Object.entries(filter).every(
		([field, value]) => field === 'status' || value === undefined || value === false || value === ''
	);
}

/** How many lots the filter matches, counting no further than `countUpTo` when given. */
export function countLots(
	filter: LotFilter,
	reader: Reader = db,
	countUpTo?: number,
	where: SQL | undefined = lotConditions(filter)
): number {
	if (countUpTo === undefined) {
		const counted = reader.select({ n: count() }).from(lot);
		return (
			filter.search ? counted.leftJoin(component, eq(lot.componentId, component.id)) : counted
		)
			.where(where)
			.get()!.n;
	}
	const matched = reader.select({ one: sql`1` }).from(lot);
	const firstMatches = (
		filter.search ? matched.leftJoin(component, eq(lot.componentId, component.id)) : matched
	)
		.where(where)
		.limit(countUpTo)
		.as('first_matches');
	return reader.select({ n: count() }).from(firstMatches).get()!.n;
}
