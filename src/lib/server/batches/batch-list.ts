import { and, count, eq, gte, inArray, lte, sql, type SQL, type SQLWrapper } from 'drizzle-orm';
import type { BatchState } from '$lib/batches';
import { db } from '../db';
import { batch, recipe, recipeVersion } from '../db/schema';
import {
	cursorOf,
	keysetPageOf,
	rowsAfter,
	sortValueOf,
	type KeysetCursor,
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

export interface BatchFilter {
	state?: BatchState;
	recipeId?: string;
	from?: string;
	to?: string;
	/** Part of the batch number, the recipe's name or what the batch is for. */
	search?: string;
}

const BATCH_SORT_COLUMNS = {
	number: batch.number,
	state: batch.state,
	recipe: recipe.name,
	volume: batch.targetVolumeMl,
	plannedOn: batch.plannedOn,
	intendedUse: batch.intendedUse
} as const;

export const BATCH_SORTS = sortKeys(BATCH_SORT_COLUMNS);
export type BatchSort = keyof typeof BATCH_SORT_COLUMNS;

function batchConditions(filter: BatchFilter): SQL | undefined {
	const conditions: SQL[] = [];
	if (filter.state) conditions.push(eq(batch.state, filter.state));
	if (filter.recipeId) conditions.push(eq(batch.recipeId, filter.recipeId));
	if (filter.from) conditions.push(gte(batch.plannedOn, filter.from));
	if (filter.to) conditions.push(lte(batch.plannedOn, filter.to));
	if (filter.search) {
		conditions.push(
			searchMatch(
				batch.id,
				{ table: 'batch_search', idColumn: 'batch_id' },
				filter.search,
				(term) =>
					sql`(lower(${batch.number}) like ${term} or lower(${recipe.name}) like ${term} or lower(${batch.intendedUse}) like ${term})`
			)
		);
	}
	return conditions.length ? and(...conditions) : undefined;
}

export type BatchListRow = ReturnType<typeof listBatchesPage>['rows'][number];

/**
 * The ids of the batches the filter matches (after the cursor's row, when given) in the list's
 * order, ties by number: a deferred join, as for lots, from only what the filter and order need.
 */
function batchIdsInOrder(
	filter: BatchFilter,
	sort: BatchSort,
	dir: SortDirection,
	cursor?: KeysetCursor
) {
	const order = orderFor(BATCH_SORT_COLUMNS[sort], dir, batch.number);
	const ids =
		sort === 'recipe' || filter.search
			? db.select({ id: batch.id }).from(batch).innerJoin(recipe, eq(batch.recipeId, recipe.id))
			: db.select({ id: batch.id }).from(batch);
	const after = cursor ? rowsAfter(BATCH_SORT_COLUMNS[sort], batch.number, cursor) : undefined;
	return { ids: ids.where(and(batchConditions(filter), after)).orderBy(...order), order };
}

/** The full rows of the batches whose ids the subquery gives, in the list's order. */
function selectBatches<E extends Record<string, SQL>>(
	pageIds: SQLWrapper,
	order: SQL[],
	extra: E = {} as E
) {
	return db
		.select({
			...extra,
			id: batch.id,
			number: batch.number,
			state: batch.state,
			recipeId: batch.recipeId,
			recipeName: recipe.name,
			versionN: recipeVersion.n,
			targetVolumeMl: batch.targetVolumeMl,
			plannedOn: batch.plannedOn,
			intendedUse: batch.intendedUse,
			preparedAt: batch.preparedAt
		})
		.from(batch)
		.innerJoin(recipe, eq(batch.recipeId, recipe.id))
		.innerJoin(recipeVersion, eq(batch.versionId, recipeVersion.id))
		.where(inArray(batch.id, pageIds))
		.orderBy(...order)
		.all();
}

/** How many batches the filter matches. */
function countBatches(filter: BatchFilter): number {
	// The recipe join is needed for the count only when the search may match a recipe's name.
	const counted = db.select({ n: count() }).from(batch);
	return (filter.search ? counted.innerJoin(recipe, eq(batch.recipeId, recipe.id)) : counted)
		.where(batchConditions(filter))
		.get()!.n;
}

/** One page of the batches the filter matches, sorted as asked, with the count of all of them. */
export function listBatchesPage(filter: BatchFilter, paging: Paging<BatchSort>) {
	const { ids, order } = batchIdsInOrder(filter, paging.sort, paging.dir);
	const rows = selectBatches(ids.limit(paging.limit).offset(offsetOf(paging)), order);
	return { rows, total: countBatches(filter) } satisfies ListPage<unknown>;
}

/** The batches after the query's cursor, sorted as asked, with the count of all and the next cursor. */
export function listBatchesByCursor(filter: BatchFilter, query: KeysetQuery<BatchSort>) {
	const { ids, order } = batchIdsInOrder(filter, query.sort, query.dir, cursorOf(query));
	const rowsRead = selectBatches(ids.limit(query.limit + 1), order, {
		sortValue: sortValueOf(BATCH_SORT_COLUMNS[query.sort])
	});
	return keysetPageOf(rowsRead, query, countBatches(filter), (row) => row.number);
}
