import { error } from '@sveltejs/kit';
import { countOf } from '$lib/plural';
import { versionNumber } from '$lib/server/recipes/access';
import { confirmStep, previewStep } from '$lib/server/csv-actions';
import { importLineCsv, previewLineCsv, readImportMode } from '$lib/server/recipes/csv';
import { findRecipe, findVersion } from '$lib/server/recipes/queries';
import type { Actions, PageServerLoad } from './$types';
import { requireActor, requirePermission } from '$lib/server/guard';

function draftOf(params: { id: string; n: string }) {
	const recipe = findRecipe(params.id);
	const version = recipe ? findVersion(recipe.id, versionNumber(params.n)) : undefined;
	if (!recipe || !version) error(404, { message: 'No such recipe version.' });
	return { recipe, version };
}

export const load: PageServerLoad = async ({ params }) => {
	requirePermission('recipe.edit');
	const { recipe, version } = draftOf(params);
	return { recipe, version: { n: version.n, status: version.status } };
};

export const actions: Actions = {
	preview: async ({ request, params }) => {
		requirePermission('recipe.edit');
		const { version } = draftOf(params);
		const formData = await request.formData();
		return previewStep(formData, (text) =>
			previewLineCsv(version, text, readImportMode(formData.get('mode')))
		);
	},
	confirm: async ({ request, params }) => {
		const actor = requireActor('recipe.edit');
		const { version } = draftOf(params);
		const formData = await request.formData();
		const mode = formData.get('mode');
		return confirmStep(
			formData,
			(text) => importLineCsv(actor, version, text, readImportMode(mode)),
			(count) =>
				mode === 'replace'
					? `Version ${version.n} now has the file’s ${countOf(count, 'line')} and its fields.`
					: `${countOf(count, 'line')} added to version ${version.n}.`
		);
	}
};
