import { error } from '@sveltejs/kit';
import { csvDownload } from '$lib/server/csv';
import { requirePermission } from '$lib/server/guard';
import { versionNumber } from '$lib/server/recipes/access';
import { exportVersionCsv } from '$lib/server/recipes/csv';
import { findRecipe, findVersion } from '$lib/server/recipes/queries';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ params }) => {
	requirePermission('recipe.view');
	const recipe = findRecipe(params.id);
	const version = recipe ? findVersion(recipe.id, versionNumber(params.n)) : undefined;
	if (!recipe || !version) error(404, { message: 'No such recipe version.' });
	return csvDownload(exportVersionCsv(recipe, version), `${recipe.name}-v${version.n}.csv`);
};
