import { requireStudyAccess } from '$lib/server/studies/access';
import { listStudies } from '$lib/server/studies/queries';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireStudyAccess();
	return { studies: listStudies() };
};
