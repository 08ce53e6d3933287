import { requireRole } from '$lib/server/guard';
import { SIMULATION_ROLES } from '$lib/simulation/roles';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireRole(...SIMULATION_ROLES);
	return {};
};
