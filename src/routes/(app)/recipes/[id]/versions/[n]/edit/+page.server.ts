import { error, fail, redirect } from '@sveltejs/kit';
import { listComponents } from '$lib/server/components/library';
import { RuleError } from '$lib/server/rule-error';
import { versionNumber } from '$lib/server/recipes/access';
import { readDraftForm } from '$lib/server/recipes/draft';
import { saveEditedDraft } from '$lib/server/recipes/draft-writes';
import { fieldsOf, StaleEditError } from '$lib/server/recipes/drafts';
import { findRecipe, findVersion, linesOf, listStockRecipes } from '$lib/server/recipes/queries';
import { toDraftFields, toDraftLines, toPickerComponents } from '$lib/server/recipes/editor-data';
import { z } from 'zod';
import { revisionField } from '$lib/server/forms';
import { libraryChangesFor } from '$lib/server/recipes/snapshot';
import type { Actions, PageServerLoad } from './$types';
import { requireActor, requirePermission } from '$lib/server/guard';

function draftVersion(params: { id: string; n: string }) {
	const recipe = findRecipe(params.id);
	if (!recipe) error(404, { message: 'No recipe with this id.' });
	const version = findVersion(recipe.id, versionNumber(params.n));
	if (!version) error(404, { message: `${recipe.name} has no version ${params.n}.` });
	return { recipe, version };
}

export const load: PageServerLoad = async ({ params }) => {
	requirePermission('recipe.edit');
	const { recipe, version } = draftVersion(params);
	if (version.status !== 'draft') redirect(303, `/recipes/${recipe.id}/versions/${version.n}`);
	return {
		recipe,
		version: { id: version.id, n: version.n, revision: version.revision },
		fields: toDraftFields(fieldsOf(version)),
		lines: toDraftLines(linesOf(version.id)),
		components: toPickerComponents(listComponents()),
		stocks: listStockRecipes().filter((s) => s.id !== recipe.id),
		libraryChanges: libraryChangesFor(version)
	};
};

export const actions: Actions = {
	save: async ({ request, params }) => {
		const actor = requireActor('recipe.edit');
		const formData = await request.formData();
		const draft = readDraftForm(formData);
		const { recipe, version } = draftVersion(params);
		const revisionRead = z
			.object({ revision: revisionField })
			.safeParse({ revision: formData.get('revision') ?? '' });
		if (!revisionRead.success) {
			const message = revisionRead.error.issues[0].message;
			return fail(400, {
				message: `Nothing was saved: ${message}`,
				fieldErrors: { revision: [message] },
				draft
			});
		}
		const revision = revisionRead.data.revision;
		try {
			const saved = saveEditedDraft(
				actor,
				{ recipeId: recipe.id, versionId: version.id, revision },
				draft
			);
			if (!saved.ok) {
				const count = Object.keys(saved.fieldErrors).length;
				return fail(400, {
					message: `Nothing was saved: ${count === 1 ? 'one input needs' : `${count} inputs need`} attention, marked below.`,
					fieldErrors: saved.fieldErrors,
					draft
				});
			}
			return { saved: true, revision: saved.value, savedAt: new Date().toISOString() };
		} catch (cause) {
			if (cause instanceof StaleEditError) {
				const theirs = cause.theirs;
				return fail(409, {
					message: cause.message,
					fieldErrors: {} as Record<string, string[]>,
					draft,
					conflict: {
						revision: theirs.revision,
						byName: theirs.byName,
						at: theirs.at.toISOString(),
						fields: toDraftFields(theirs.fields),
						lines: toDraftLines(theirs.lines),
						names: theirs.lines.map((l) => l.componentName ?? l.stockRecipeName ?? '')
					}
				});
			}
			if (cause instanceof RuleError) {
				return fail(cause.status, {
					message: `Nothing was saved: ${cause.message}`,
					fieldErrors: cause.field ? { [cause.field]: [cause.message] } : {},
					draft
				});
			}
			throw cause;
		}
	}
};
