// The writes of a draft that the new-recipe page, the editor and the JSON API share: one check, one
// analysis and one store, so a draft is refused or saved for the same reasons whichever door it came by.
import { z } from 'zod';
import { RECIPE_KINDS } from '$lib/recipes';
import type { Actor } from '../audit';
import type { FieldErrors } from '../forms';
import { analyseLines } from './analysis';
import {
	checkDraft,
	type Checked,
	type CheckedFields,
	type CheckedLine,
	type DraftInput
} from './draft';
import { createRecipesWithDrafts, saveDraft } from './drafts';

/** The new-recipe form: a name and what kind of recipe it is. */
export const recipeHeadSchema = z.object({
	name: z
		.string()
		.trim()
		.min(1, 'Give the recipe a name.')
		.max(120, 'Keep the name to 120 characters.'),
	kind: z.enum(RECIPE_KINDS, { error: 'Choose what kind of recipe this is.' })
});

/** The analysis the editor's save runs: a rule it breaks (a stock that doses itself …) stops the save. */
function analyseForSave(
	draft: { fields: CheckedFields; lines: CheckedLine[] },
	recipeId: string | null
): void {
	analyseLines(draft.lines, {
		temperatureC: draft.fields.preparationTemperatureC,
		osmolalityMinMOsmPerKg: null,
		osmolalityMaxMOsmPerKg: null,
		recipeId
	});
}

/**
 * The editor's save: every field and line checked at once; then analysed and stored over `revision`
 * (a save from an older revision throws `StaleEditError`). Answers the new revision.
 */
export function saveEditedDraft(
	actor: Actor,
	at: { recipeId: string; versionId: string; revision: number },
	draft: DraftInput
): Checked<number> {
	const checked = checkDraft(draft, at.recipeId);
	if (!checked.ok) return checked;
	analyseForSave(checked.value, at.recipeId);
	return { ok: true, value: saveDraft(actor, at.versionId, at.revision, checked.value) };
}

/**
 * A new recipe whose version 1 draft already holds these fields and lines: the new-recipe form's
 * name and kind, then the editor's checks, every problem at once. Answers the recipe id.
 */
export function createRecipeWithDraft(
	actor: Actor,
	head: { name: unknown; kind: unknown },
	draft: DraftInput
): Checked<string> {
	const fieldErrors: FieldErrors = {};
	const headRead = recipeHeadSchema.safeParse(head);
	if (!headRead.success)
		for (const issue of headRead.error.issues)
			(fieldErrors[issue.path.join('.') || 'name'] ??= []).push(issue.message);
	const checked = checkDraft(draft, null);
	if (!checked.ok) Object.assign(fieldErrors, checked.fieldErrors);
	if (!headRead.success || !checked.ok) return { ok: false, fieldErrors };
	analyseForSave(checked.value, null);
	const [recipeId] = createRecipesWithDrafts(actor, [{ ...headRead.data, ...checked.value }]);
	return { ok: true, value: recipeId };
}
