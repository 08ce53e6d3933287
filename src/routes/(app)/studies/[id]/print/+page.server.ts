import { requirePermission } from '$lib/server/guard';
import { loadStudyReport } from '$lib/server/studies/page-load';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requirePermission('study.use');
	return await loadStudyReport(params.id);
};
