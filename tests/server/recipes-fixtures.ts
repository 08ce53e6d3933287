import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { blankLine, type DraftFieldsInput, type DraftLineInput } from '$lib/recipes';
import { checkDraft } from '$lib/server/recipes/draft';
import { createRecipe, saveDraft } from '$lib/server/recipes/drafts';
import { findVersion } from '$lib/server/recipes/queries';

export const EMPTY_FIELDS: DraftFieldsInput = {
	targetPh: '7.0',
	osmolalityMinMOsmPerKg: '',
	osmolalityMaxMOsmPerKg: '',
	preparationTemperatureC: '25',
	shelfLifeDays: '',
	storage: '',
	instructions: 'Dissolve in order.',
	changeNote: ''
};

export function line(
	componentId: string,
	amount: string | number,
	unit = 'g/L',
	extra: Partial<DraftLineInput> = {}
): DraftLineInput {
	return { ...blankLine('component'), componentId, amount: String(amount), unit, ...extra };
}

export function stockLine(stockRecipeId: string, mlPerL: string | number): DraftLineInput {
	return { ...blankLine('stock'), stockRecipeId, amount: String(mlPerL) };
}

let loaded = false;
export function loadLibrary() {
	if (!loaded) seedReferenceLibrary();
	loaded = true;
}

let n = 0;
/** A recipe with version 1 saved as a draft with these lines; returns ids and the draft's revision. */
export function draftRecipe(
	author: { id: string; email: string },
	lines: DraftLineInput[],
	kind = 'basal',
	fields: Partial<DraftFieldsInput> = {}
) {
	loadLibrary();
	n++;
	const recipeId = createRecipe(author, {
		name: `Test recipe ${n} ${crypto.randomUUID().slice(0, 4)}`,
		kind
	});
	const version = findVersion(recipeId, 1)!;
	const checked = checkDraft({ fields: { ...EMPTY_FIELDS, ...fields }, lines }, recipeId);
	if (!checked.ok) throw new Error(JSON.stringify(checked.fieldErrors));
	const revision = saveDraft(author, version.id, version.revision, checked.value);
	return { recipeId, versionId: version.id, revision, checked: checked.value };
}
