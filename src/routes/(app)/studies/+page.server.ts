import { requirePermission } from '$lib/server/guard';
import { listStudies } from '$lib/server/studies/queries';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('study.use');
	return { studies: listStudies() };
};
