// The recipe writes of the JSON API, on the rules the pages use (draft-writes.ts, workflow.ts): the
// body read into the editor's text fields, each refusal at its body path, the answer with its ETag.
import type { DraftFieldsInput, DraftLineInput } from '$lib/recipes';
import { draftFieldsText } from '$lib/recipes/draft-schema';
import { withEtag } from '../api/etag';
import { problemsOfFieldErrors, refusalOf } from '../api/refusals';
import type { Actor } from '../audit';
import type { Recipe, RecipeVersion } from '../db/schema';
import { RuleError } from '../rule-error';
import { versionNumber } from './access';
import { normaliseLineInput, type Checked } from './draft';
import { saveEditedDraft } from './draft-writes';
import { fieldsOf } from './drafts';
import { toDraftFields, toDraftLines } from './editor-data';
import { findRecipe, findVersion, linesOf } from './queries';
import { versionView } from './view';

/** What submitting answers: the page's own sentence and how many reviewers were told. */
export interface SubmitOutcome {
	n: number;
	status: 'in_review';
	reviewersMailed: number;
	message: string;
}

/** The recipe and its version n, or a 404 naming what is missing. */
export function versionAt(params: { id?: string; n?: string }): {
	recipe: Recipe;
	version: RecipeVersion;
} {
	const recipe = findRecipe(params.id ?? '');
	if (!recipe) throw new RuleError('No recipe with this id.', { status: 404 });
	const n = versionNumber(params.n ?? '');
	const version = findVersion(recipe.id, n);
	if (!version) throw new RuleError(`${recipe.name} has no version ${n}.`, { status: 404 });
	return { recipe, version };
}

/** A version as GET answers it (composition and all), with its revision as the ETag. */
export function versionAnswer(
	recipeId: string,
	n: number,
	created?: { status: 201; location: string }
): Response {
	const { analysis, ...view } = versionView(recipeId, n);
	const response = withEtag(
		{ ...view, composition: analysis },
		view.version.revision,
		created?.status
	);
	if (created) response.headers.set('location', created.location);
	return response;
}

export function versionLocation(recipeId: string, n: number): string {
	return `/api/v1/recipes/${recipeId}/versions/${n}`;
}

type LooseFields = Partial<Record<keyof DraftFieldsInput, string | number | null | undefined>>;

/** Fields sent over the API as the editor's text; a field left out keeps `kept`'s value. */
export function draftFieldsOf(sent: LooseFields, kept?: DraftFieldsInput): DraftFieldsInput {
	const given = Object.fromEntries(Object.entries(sent).filter(([, v]) => v !== undefined));
	return draftFieldsText.parse({ ...kept, ...given });
}

/** Lines sent over the API as the editor's text lines. */
export function draftLinesOf(sent: Partial<Record<keyof DraftLineInput, unknown>>[]) {
	return sent.map(normaliseLineInput);
}

/** The stored draft as the editor opens it. */
export function storedDraft(version: RecipeVersion) {
	return {
		fields: toDraftFields(fieldsOf(version)),
		lines: toDraftLines(linesOf(version.id))
	};
}

/** A refused check as a problem: every field and line at its path, in the editor's words. */
export function orRefused<T>(checked: Checked<T>): T {
	if (!checked.ok) throw refusalOf(problemsOfFieldErrors(checked.fieldErrors));
	return checked.value;
}

/** The editor's save of a draft through the API, from the revision If-Match named. */
export function saveDraftFromApi(
	actor: Actor,
	at: { recipe: Recipe; version: RecipeVersion; revision: number },
	draft: { fields: DraftFieldsInput; lines: DraftLineInput[] }
): number {
	return orRefused(
		saveEditedDraft(
			actor,
			{ recipeId: at.recipe.id, versionId: at.version.id, revision: at.revision },
			draft
		)
	);
}
