import { requirePermission } from '$lib/server/guard';
import { loadVersionView } from '$lib/server/recipes/page-load';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requirePermission('recipe.view');
	return { ...loadVersionView(params), printedAt: new Date() };
};
