import { and, asc, count, desc, eq, exists, inArray, like, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { RecipeKind, VersionStatus } from '$lib/recipes';
import { db, type Db } from '../db';
import {
	component,
	recipe,
	recipeLine,
	recipeVersion,
	recipeVersionEditor,
	user,
	type Recipe,
	type RecipeLine,
	type RecipeVersion
} from '../db/schema';
import { cursorOf, keysetPageOf, rowsAfter, sortValueOf, type KeysetQuery } from '../keyset';
import { orderFor, sortKeys } from '../list-paging';
import { signaturesFor } from '../signatures';

type Reader = Pick<Db, 'select'>;

export interface RecipeFilter {
	kind?: RecipeKind;
	/** Recipes having a version in this status. */
	status?: VersionStatus;
	/** Recipes having a version that contains this component (directly or as the form weighed). */
	componentId?: string;
	search?: string;
	page: number;
	pageSize: number;
}

export interface RecipeSummary {
	id: string;
	name: string;
	kind: RecipeKind;
	ownerName: string;
	latest: { n: number; status: VersionStatus; updatedAt: Date };
	approvedN: number | null;
	versionCount: number;
}

function filterConditions(filter: Omit<RecipeFilter, 'page' | 'pageSize'>): SQL | undefined {
	const conditions: SQL[] = [];
	if (filter.kind) conditions.push(eq(recipe.kind, filter.kind));
	if (filter.search)
		conditions.push(
			like(sql`lower(${recipe.name})`, `%${filter.search.toLowerCase().replace(/[%_]/g, '')}%`)
		);
	if (filter.status) {
		conditions.push(
			exists(
				db
					.select({ one: sql`1` })
					.from(recipeVersion)
					.where(
						and(eq(recipeVersion.recipeId, recipe.id), eq(recipeVersion.status, filter.status))
					)
			)
		);
	}
	if (filter.componentId) {
		conditions.push(
			exists(
				db
					.select({ one: sql`1` })
					.from(recipeLine)
					.innerJoin(recipeVersion, eq(recipeLine.versionId, recipeVersion.id))
					.where(
						and(
							eq(recipeVersion.recipeId, recipe.id),
							or(
								eq(recipeLine.componentId, filter.componentId),
								eq(recipeLine.shelfFormId, filter.componentId)
							)
						)
					)
			)
		);
	}
	return conditions.length ? and(...conditions) : undefined;
}

// Names are unique: the id only makes the tie-breaker a cursor can name.
const RECIPE_SORT_COLUMNS = { name: recipe.name } as const;

export const RECIPE_SORTS = sortKeys(RECIPE_SORT_COLUMNS);
export type RecipeSort = keyof typeof RECIPE_SORT_COLUMNS;

/** The recipes the condition matches with their owner's name, unordered. */
function selectRecipes<E extends Record<string, SQL>>(where: SQL | undefined, extra: E = {} as E) {
	return db
		.select({ ...extra, id: recipe.id, name: recipe.name, kind: recipe.kind, ownerName: user.name })
		.from(recipe)
		.innerJoin(user, eq(recipe.ownerId, user.id))
		.where(where);
}

/** Each recipe with its latest version, its approved one and how many it has. */
function withVersionSummary<R extends { id: string }>(recipes: R[]) {
	const versions = recipes.length
		? db
				.select({
					recipeId: recipeVersion.recipeId,
					n: recipeVersion.n,
					status: recipeVersion.status,
					updatedAt: recipeVersion.updatedAt
				})
				.from(recipeVersion)
				.where(
					inArray(
						recipeVersion.recipeId,
						recipes.map((r) => r.id)
					)
				)
				.orderBy(desc(recipeVersion.n))
				.all()
		: [];
	return recipes.map((r) => {
		const own = versions.filter((v) => v.recipeId === r.id);
		const [{ n, status, updatedAt }] = own;
		return {
			...r,
			latest: { n, status, updatedAt },
			approvedN: own.find((v) => v.status === 'approved')?.n ?? null,
			versionCount: own.length
		};
	});
}

function countRecipes(where: SQL | undefined): number {
	return db.select({ total: count() }).from(recipe).where(where).get()!.total;
}

export function listRecipes(filter: RecipeFilter): { rows: RecipeSummary[]; total: number } {
	const where = filterConditions(filter);
	const recipes = selectRecipes(where)
		.orderBy(...orderFor(RECIPE_SORT_COLUMNS.name, 'asc', recipe.id))
		.limit(filter.pageSize)
		.offset((filter.page - 1) * filter.pageSize)
		.all();
	return { rows: withVersionSummary(recipes), total: countRecipes(where) };
}

/** The recipes after the query's cursor, sorted as asked, with the count of all and the next cursor. */
export function listRecipesByCursor(
	filter: Omit<RecipeFilter, 'page' | 'pageSize'>,
	query: KeysetQuery<RecipeSort>
) {
	const where = filterConditions(filter);
	const cursor = cursorOf(query);
	const sortColumn = RECIPE_SORT_COLUMNS[query.sort];
	const rowsRead = selectRecipes(and(where, cursor && rowsAfter(sortColumn, recipe.id, cursor)), {
		sortValue: sortValueOf(sortColumn)
	})
		.orderBy(...orderFor(sortColumn, query.dir, recipe.id))
		.limit(query.limit + 1)
		.all();
	return keysetPageOf(withVersionSummary(rowsRead), query, countRecipes(where));
}

export function findRecipe(id: string, reader: Reader = db): Recipe | undefined {
	return reader.select().from(recipe).where(eq(recipe.id, id)).get();
}

export function listStockRecipes(): { id: string; name: string; approvedN: number | null }[] {
	const stocks = db
		.select({ id: recipe.id, name: recipe.name })
		.from(recipe)
		.where(eq(recipe.kind, 'stock_solution'))
		.orderBy(asc(recipe.name))
		.all();
	return stocks.map((s) => ({ ...s, approvedN: currentApprovedVersion(s.id)?.n ?? null }));
}

const approver = alias(user, 'approver');

export function versionsOf(recipeId: string) {
	return db
		.select({
			id: recipeVersion.id,
			n: recipeVersion.n,
			status: recipeVersion.status,
			authorId: recipeVersion.authorId,
			authorName: user.name,
			approvedByName: approver.name,
			createdAt: recipeVersion.createdAt,
			updatedAt: recipeVersion.updatedAt,
			submittedAt: recipeVersion.submittedAt,
			approvedAt: recipeVersion.approvedAt,
			retiredAt: recipeVersion.retiredAt,
			basedOnVersionId: recipeVersion.basedOnVersionId,
			changeNote: recipeVersion.changeNote
		})
		.from(recipeVersion)
		.innerJoin(user, eq(recipeVersion.authorId, user.id))
		.leftJoin(approver, eq(recipeVersion.approvedById, approver.id))
		.where(eq(recipeVersion.recipeId, recipeId))
		.orderBy(desc(recipeVersion.n))
		.all();
}

export function findVersion(
	recipeId: string,
	n: number,
	reader: Reader = db
): RecipeVersion | undefined {
	if (!Number.isInteger(n)) return undefined;
	return reader
		.select()
		.from(recipeVersion)
		.where(and(eq(recipeVersion.recipeId, recipeId), eq(recipeVersion.n, n)))
		.get();
}

export function findVersionById(id: string, reader: Reader = db): RecipeVersion | undefined {
	return reader.select().from(recipeVersion).where(eq(recipeVersion.id, id)).get();
}

/** Everyone who changed the version by any route (kept by the database, see recipe_version_editor). */
export function editorIdsOf(versionId: string, reader: Reader = db): string[] {
	return reader
		.select({ userId: recipeVersionEditor.userId })
		.from(recipeVersionEditor)
		.where(eq(recipeVersionEditor.versionId, versionId))
		.all()
		.map((row) => row.userId);
}

export function currentApprovedVersion(
	recipeId: string,
	reader: Reader = db
): RecipeVersion | undefined {
	return reader
		.select()
		.from(recipeVersion)
		.where(and(eq(recipeVersion.recipeId, recipeId), eq(recipeVersion.status, 'approved')))
		.orderBy(desc(recipeVersion.n))
		.get();
}

export function latestVersion(recipeId: string, reader: Reader = db): RecipeVersion | undefined {
	return reader
		.select()
		.from(recipeVersion)
		.where(eq(recipeVersion.recipeId, recipeId))
		.orderBy(desc(recipeVersion.n))
		.get();
}

export function linesOf(versionId: string, reader: Reader = db): RecipeLine[] {
	return reader
		.select()
		.from(recipeLine)
		.where(eq(recipeLine.versionId, versionId))
		.orderBy(asc(recipeLine.position))
		.all();
}

const shelf = alias(component, 'shelf');
const stockRecipe = alias(recipe, 'stock_recipe');
const stockVersion = alias(recipeVersion, 'stock_version');

/** Lines with the names a person reads: component, form weighed, stock and its pinned version. */
export function describedLinesOf(versionId: string) {
	return db
		.select({
			id: recipeLine.id,
			position: recipeLine.position,
			kind: recipeLine.kind,
			componentId: recipeLine.componentId,
			componentName: component.name,
			formula: component.formula,
			shelfFormId: recipeLine.shelfFormId,
			shelfFormName: shelf.name,
			stockRecipeId: recipeLine.stockRecipeId,
			stockRecipeName: stockRecipe.name,
			stockVersionN: stockVersion.n,
			amount: recipeLine.amount,
			unit: recipeLine.unit,
			tolerancePercent: recipeLine.tolerancePercent,
			note: recipeLine.note
		})
		.from(recipeLine)
		.leftJoin(component, eq(recipeLine.componentId, component.id))
		.leftJoin(shelf, eq(recipeLine.shelfFormId, shelf.id))
		.leftJoin(stockRecipe, eq(recipeLine.stockRecipeId, stockRecipe.id))
		.leftJoin(stockVersion, eq(recipeLine.stockVersionId, stockVersion.id))
		.where(eq(recipeLine.versionId, versionId))
		.orderBy(asc(recipeLine.position))
		.all();
}

export type DescribedLine = ReturnType<typeof describedLinesOf>[number];

export function versionSignatures(versionId: string) {
	return signaturesFor('recipe_version', [versionId]);
}

export function personName(id: string | null): string | null {
	if (!id) return null;
	return db.select({ name: user.name }).from(user).where(eq(user.id, id)).get()?.name ?? null;
}
