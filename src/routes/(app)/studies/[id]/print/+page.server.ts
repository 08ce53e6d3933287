import { requireStudyAccess } from '$lib/server/studies/access';
import { loadStudyReport } from '$lib/server/studies/page-load';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requireStudyAccess();
	return loadStudyReport(params.id);
};
