import { GROWTH_FIT_HELP, MIN_GROWTH_FIT_POINTS } from '$chemistry';
import { requireRole } from '$lib/server/guard';
import { SIMULATION_ROLES } from '$lib/simulation/roles';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireRole(...SIMULATION_ROLES);
	return { fitHelp: GROWTH_FIT_HELP, minPoints: MIN_GROWTH_FIT_POINTS };
};
