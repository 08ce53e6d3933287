import { error } from '@sveltejs/kit';
import { versionNumber } from '$lib/server/recipes/access';
import { confirmStep, previewStep } from '$lib/server/csv-actions';
import { importLineCsv, previewLineCsv } from '$lib/server/recipes/csv';
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
		return previewStep(await request.formData(), (text) => previewLineCsv(version, text));
	},
	confirm: async ({ request, params }) => {
		const actor = requireActor('recipe.edit');
		const { version } = draftOf(params);
		return confirmStep(
			await request.formData(),
			(text) => importLineCsv(actor, version, text),
			(count) => `${count} line${count === 1 ? '' : 's'} added to version ${version.n}.`
		);
	}
};
