import { formatDateTime } from '$lib/date-time';
import { siteTimeZone } from '../site-time-zone';
import { and, eq, inArray, max, sql } from 'drizzle-orm';
import { RECIPE_KINDS, type RecipeKind } from '$lib/recipes';
import { changesBetween, recordAudit, type Actor } from '../audit';
import { db, type Db } from '../db';
import { recipe, recipeLine, recipeVersion, user, type RecipeVersion } from '../db/schema';
import { RuleError } from '../rule-error';
import type { CheckedFields, CheckedLine } from './draft';
import { describedLinesOf, findVersionById, linesOf } from './queries';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** Someone else saved the draft after this editor opened it: carries what they saved. */
export class StaleEditError extends RuleError {
	constructor(
		message: string,
		readonly theirs: {
			revision: number;
			byName: string | null;
			at: Date;
			fields: CheckedFields;
			lines: ReturnType<typeof describedLinesOf>;
		}
	) {
		super(message, { status: 409 });
	}
}

export function fieldsOf(version: RecipeVersion): CheckedFields {
	return {
		targetPh: version.targetPh,
		osmolalityMinMOsmPerKg: version.osmolalityMinMOsmPerKg,
		osmolalityMaxMOsmPerKg: version.osmolalityMaxMOsmPerKg,
		preparationTemperatureC: version.preparationTemperatureC,
		shelfLifeDays: version.shelfLifeDays,
		storage: version.storage,
		instructions: version.instructions,
		changeNote: version.changeNote
	};
}

export function checkRecipeHead(
	input: { name: string; kind: string },
	selfId?: string
): { name: string; kind: RecipeKind } {
	const name = input.name.trim();
	if (!name) throw new RuleError('Give the recipe a name.', { field: 'name' });
	if (name.length > 120) throw new RuleError('Keep the name to 120 characters.', { field: 'name' });
	if (!(RECIPE_KINDS as readonly string[]).includes(input.kind)) {
		throw new RuleError('Choose what kind of recipe this is.', { field: 'kind' });
	}
	const clash = db
		.select({ id: recipe.id })
		.from(recipe)
		.where(sql`lower(${recipe.name}) = lower(${name})`)
		.get();
	if (clash && clash.id !== selfId)
		throw new RuleError(`A recipe named “${name}” already exists.`, { field: 'name' });
	return { name, kind: input.kind as RecipeKind };
}

/** What a line says, for the trail: everything but its ids of storage. */
function lineContent(line: Omit<CheckedLine, 'position'>) {
	return {
		kind: line.kind,
		componentId: line.componentId,
		shelfFormId: line.shelfFormId,
		stockRecipeId: line.stockRecipeId,
		amount: line.amount,
		unit: line.unit,
		tolerancePercent: line.tolerancePercent,
		note: line.note
	};
}

/** Lines added, removed or changed, by position, each with what it said before and after. */
function lineChangesBetween(before: CheckedLine[], after: CheckedLine[]) {
	const positions = [...new Set([...before, ...after].map((l) => l.position))].sort(
		(a, b) => a - b
	);
	return positions.flatMap((position) => {
		const was = before.find((l) => l.position === position);
		const now = after.find((l) => l.position === position);
		const from = was ? lineContent(was) : null;
		const to = now ? lineContent(now) : null;
		return JSON.stringify(from) === JSON.stringify(to) ? [] : [{ position, from, to }];
	});
}

function insertLines(tx: Tx, versionId: string, lines: CheckedLine[]) {
	for (const line of lines) {
		tx.insert(recipeLine)
			.values({
				versionId,
				position: line.position,
				kind: line.kind,
				componentId: line.componentId,
				shelfFormId: line.shelfFormId,
				stockRecipeId: line.stockRecipeId,
				amount: line.amount,
				unit: line.unit,
				tolerancePercent: line.tolerancePercent,
				note: line.note
			})
			.run();
	}
}

function insertRecipe(
	tx: Tx,
	actor: Actor,
	head: { name: string; kind: RecipeKind },
	draft: {
		fields?: Partial<CheckedFields>;
		lines?: CheckedLine[];
		origin?: Record<string, unknown>;
	} = {}
): string {
	const recipeId = crypto.randomUUID();
	tx.insert(recipe)
		.values({ id: recipeId, name: head.name, kind: head.kind, ownerId: actor.id! })
		.run();
	const versionId = crypto.randomUUID();
	tx.insert(recipeVersion)
		.values({
			id: versionId,
			recipeId,
			n: 1,
			authorId: actor.id!,
			updatedById: actor.id,
			...draft.fields
		})
		.run();
	const lines = draft.lines ?? [];
	insertLines(tx, versionId, lines);
	const detail = {
		name: head.name,
		kind: head.kind,
		versionId,
		...(lines.length ? { lines: lines.length } : {}),
		...(draft.origin ? { origin: draft.origin } : {})
	};
	recordAudit(
		actor,
		{ action: 'recipe.created', subjectType: 'recipe', subjectId: recipeId, detail },
		tx
	);
	return recipeId;
}

/** A new recipe with an empty draft, version 1. Returns the recipe id. */
export function createRecipe(
	actor: Actor,
	input: { name: string; kind: string },
	fields?: Partial<CheckedFields>
): string {
	const head = checkRecipeHead(input);
	return db.transaction((tx) => insertRecipe(tx, actor, head, { fields }));
}

/**
 * New recipes whose version 1 drafts already hold checked lines, all or none. A name problem is
 * reported at `nameField` (default `name`). `origin` goes into each creation's audit entry.
 */
export function createRecipesWithDrafts(
	actor: Actor,
	drafts: {
		name: string;
		kind: string;
		nameField?: string;
		fields: CheckedFields;
		lines: CheckedLine[];
	}[],
	origin?: Record<string, unknown>
): string[] {
	return db.transaction((tx) =>
		drafts.map((draft) => {
			let head: { name: string; kind: RecipeKind };
			try {
				// Inside the transaction, so two new recipes of one call cannot share a name either.
				head = checkRecipeHead(draft);
			} catch (cause) {
				if (cause instanceof RuleError && cause.field === 'name' && draft.nameField)
					throw new RuleError(cause.message, { field: draft.nameField, status: cause.status });
				throw cause;
			}
			return insertRecipe(tx, actor, head, { fields: draft.fields, lines: draft.lines, origin });
		})
	);
}

function requireDraft(version: RecipeVersion | undefined): RecipeVersion {
	if (!version) throw new RuleError('No such recipe version.', { status: 404 });
	if (version.status !== 'draft') {
		throw new RuleError(
			`Version ${version.n} is ${version.status.replace('_', ' ')} and can no longer be edited; start a new draft from it.`,
			{ status: 409 }
		);
	}
	return version;
}

/**
 * Saves a draft edited from `revision`. If anyone saved it since, nothing is written and the error
 * carries their version, so the editor can show it beside the user's own unsaved lines.
 */
export function saveDraft(
	actor: Actor,
	versionId: string,
	revision: number,
	draft: { fields: CheckedFields; lines: CheckedLine[] },
	/** set when the lines and fields came from a CSV file rather than the editor */
	from: 'editor' | 'csv' = 'editor'
): number {
	return db.transaction((tx) => {
		const version = requireDraft(findVersionById(versionId, tx));
		if (version.revision !== revision) {
			const byName = version.updatedById
				? (tx.select({ name: user.name }).from(user).where(eq(user.id, version.updatedById)).get()
						?.name ?? null)
				: null;
			throw new StaleEditError(
				`${byName ?? 'Someone'} saved this draft at ${formatDateTime(version.updatedAt, siteTimeZone())}, after you opened it. Nothing of yours was saved: your lines are still here. Compare with theirs below, then save again to replace theirs, or take theirs.`,
				{
					revision: version.revision,
					byName,
					at: version.updatedAt,
					fields: fieldsOf(version),
					lines: describedLinesOf(version.id)
				}
			);
		}
		const changes = changesBetween(fieldsOf(version), draft.fields);
		const lineChanges = lineChangesBetween(linesOf(versionId, tx), draft.lines);
		tx.update(recipeVersion)
			.set({
				...draft.fields,
				revision: revision + 1,
				updatedById: actor.id,
				updatedAt: new Date()
			})
			.where(eq(recipeVersion.id, versionId))
			.run();
		tx.delete(recipeLine).where(eq(recipeLine.versionId, versionId)).run();
		insertLines(tx, versionId, draft.lines);
		recordAudit(
			actor,
			{
				action: 'recipe.draft_saved',
				subjectType: 'recipe_version',
				subjectId: versionId,
				detail: {
					n: version.n,
					lines: draft.lines.length,
					changes,
					lineChanges,
					revision: revision + 1,
					...(from === 'csv' ? { from } : {})
				}
			},
			tx
		);
		return revision + 1;
	});
}

/** Appends lines (a CSV import) to a draft, in one transaction. */
export function appendLines(
	actor: Actor,
	versionId: string,
	lines: Omit<CheckedLine, 'position'>[]
): void {
	db.transaction((tx) => {
		const version = requireDraft(findVersionById(versionId, tx));
		const [{ last }] = tx
			.select({ last: max(recipeLine.position) })
			.from(recipeLine)
			.where(eq(recipeLine.versionId, versionId))
			.all();
		insertLines(
			tx,
			versionId,
			lines.map((l, i) => ({ ...l, position: (last ?? 0) + i + 1 }))
		);
		tx.update(recipeVersion)
			.set({ revision: version.revision + 1, updatedById: actor.id, updatedAt: new Date() })
			.where(eq(recipeVersion.id, versionId))
			.run();
		recordAudit(
			actor,
			{
				action: 'recipe.lines_imported',
				subjectType: 'recipe_version',
				subjectId: versionId,
				detail: {
					n: version.n,
					lines: lines.length,
					lineChanges: lines.map((l, i) => ({
						position: (last ?? 0) + i + 1,
						from: null,
						to: lineContent(l)
					}))
				}
			},
			tx
		);
	});
}

/** A new draft copied from any version of the recipe; one open draft or review at a time. */
export function startDraftFrom(actor: Actor, sourceVersionId: string): RecipeVersion {
	return db.transaction((tx) => {
		const source = findVersionById(sourceVersionId, tx);
		if (!source) throw new RuleError('No such recipe version.', { status: 404 });
		const open = tx
			.select({ n: recipeVersion.n, status: recipeVersion.status })
			.from(recipeVersion)
			.where(
				and(
					eq(recipeVersion.recipeId, source.recipeId),
					inArray(recipeVersion.status, ['draft', 'in_review'])
				)
			)
			.get();
		if (open) {
			throw new RuleError(
				`Version ${open.n} is still ${open.status.replace('_', ' ')}; finish it (or return it to draft and edit it) before starting another.`,
				{ status: 409 }
			);
		}
		const [{ last }] = tx
			.select({ last: max(recipeVersion.n) })
			.from(recipeVersion)
			.where(eq(recipeVersion.recipeId, source.recipeId))
			.all();
		const created = tx
			.insert(recipeVersion)
			.values({
				recipeId: source.recipeId,
				n: (last ?? 0) + 1,
				authorId: actor.id!,
				updatedById: actor.id,
				basedOnVersionId: source.id,
				...fieldsOf(source),
				changeNote: ''
			})
			.returning()
			.get();
		insertLines(tx, created.id, linesOf(source.id, tx));
		recordAudit(
			actor,
			{
				action: 'recipe.draft_started',
				subjectType: 'recipe_version',
				subjectId: created.id,
				detail: { n: created.n, basedOn: source.n }
			},
			tx
		);
		return created;
	});
}
