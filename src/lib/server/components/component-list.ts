import { and, count, eq, sql, type SQL } from 'drizzle-orm';
import type { ComponentCategoryName } from '$lib/recipes';
import { db } from '../db';
import { component } from '../db/schema';
import {
	cursorOf,
	keysetPageOf,
	rowsAfter,
	sortValueOf,
	type KeysetPage,
	type KeysetQuery
} from '../keyset';
import { offsetOf, orderFor, sortKeys, type ListPage, type Paging } from '../list-paging';
import type { Component } from '../db/schema';

export interface ComponentFilter {
	category?: ComponentCategoryName;
	/** Part of the name, a synonym, the formula, the CAS number or a GHS hazard code. */
	search?: string;
}

const COMPONENT_SORT_COLUMNS = {
	name: sql`lower(${component.name})`,
	formula: component.formula,
	category: component.category,
	casNumber: component.casNumber
} as const;

export const COMPONENT_SORTS = sortKeys(COMPONENT_SORT_COLUMNS);
export type ComponentSort = keyof typeof COMPONENT_SORT_COLUMNS;

function componentConditions(filter: ComponentFilter): SQL | undefined {
	const conditions: SQL[] = [];
	if (filter.category) conditions.push(eq(component.category, filter.category));
	if (filter.search) {
		// A library holds thousands of components at most: a scan is fast enough, and the JSON
		// columns (synonyms, hazards) are searched as their text.
		const term = `%${filter.search.toLowerCase().replace(/[%_]/g, '')}%`;
		conditions.push(
			sql`(lower(${component.name}) like ${term} or lower(coalesce(${component.formula}, '')) like ${term} or lower(coalesce(${component.casNumber}, '')) like ${term} or lower(${component.synonyms}) like ${term} or lower(${component.ghsHazards}) like ${term})`
		);
	}
	return conditions.length ? and(...conditions) : undefined;
}

function countComponents(where: SQL | undefined): number {
	return db.select({ n: count() }).from(component).where(where).get()!.n;
}

/** One page of the library, sorted as asked, with the count of every component the filter matches. */
export function listComponentsPage(
	filter: ComponentFilter,
	paging: Paging<ComponentSort>
): ListPage<Component> {
	const where = componentConditions(filter);
	const rows = db
		.select()
		.from(component)
		.where(where)
		.orderBy(...orderFor(COMPONENT_SORT_COLUMNS[paging.sort], paging.dir, component.id))
		.limit(paging.limit)
		.offset(offsetOf(paging))
		.all();
	return { rows, total: countComponents(where) };
}

/** The components after the query's cursor, sorted as asked, with the count of all and the next cursor. */
export function listComponentsByCursor(
	filter: ComponentFilter,
	query: KeysetQuery<ComponentSort>
): KeysetPage<Component> {
	const where = componentConditions(filter);
	const cursor = cursorOf(query);
	const sortColumn = COMPONENT_SORT_COLUMNS[query.sort];
	const rowsRead = db
		.select({ row: component, sortValue: sortValueOf(sortColumn) })
		.from(component)
		.where(and(where, cursor && rowsAfter(sortColumn, component.id, cursor)))
		.orderBy(...orderFor(sortColumn, query.dir, component.id))
		.limit(query.limit + 1)
		.all()
		.map(({ row, sortValue }) => ({ ...row, sortValue }));
	return keysetPageOf(rowsRead, query, countComponents(where));
}
