import { requirePermission } from '$lib/server/guard';
import { listPeople } from '$lib/server/people';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('admin.people');
	return { people: listPeople() };
};
