import { requireUser } from '$lib/server/guard';
import { loadVersionView } from '$lib/server/recipes/page-load';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requireUser();
	return { ...loadVersionView(params), printedAt: new Date() };
};
