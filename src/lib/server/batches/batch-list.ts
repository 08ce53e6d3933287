import { and, count, eq, gte, inArray, lte, sql, type SQL } from 'drizzle-orm';
import type { BatchState } from '$lib/batches';
import { db } from '../db';
import { batch, recipe, recipeVersion } from '../db/schema';
import { offsetOf, orderFor, sortKeys, type ListPage, type Paging } from '../list-paging';
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

export type BatchListRow = Awaited<ReturnType<typeof listBatchesPage>>['rows'][number];

/** One page of the batches the filter matches, sorted as asked, with the count of all of them. */
export function listBatchesPage(filter: BatchFilter, paging: Paging<BatchSort>) {
	const where = batchConditions(filter);
	const order = orderFor(BATCH_SORT_COLUMNS[paging.sort], paging.dir, batch.number);
	// A deferred join, as for lots: the page's ids first, from only what the filter and order need.
	const ids =
		paging.sort === 'recipe' || filter.search
			? db.select({ id: batch.id }).from(batch).innerJoin(recipe, eq(batch.recipeId, recipe.id))
			: db.select({ id: batch.id }).from(batch);
	const pageIds = ids
		.where(where)
		.orderBy(...order)
		.limit(paging.limit)
		.offset(offsetOf(paging));
	const rows = db
		.select({
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
	// The recipe join is needed for the count only when the search may match a recipe's name.
	const counted = db.select({ n: count() }).from(batch);
	const total = (filter.search ? counted.innerJoin(recipe, eq(batch.recipeId, recipe.id)) : counted)
		.where(where)
		.get()!.n;
	return { rows, total } satisfies ListPage<unknown>;
}
