import { requirePermission } from '$lib/server/guard';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('simulation.use');
	return {};
};
