import { GROWTH_FIT_HELP, MIN_GROWTH_FIT_POINTS } from '$chemistry';
import { requirePermission } from '$lib/server/guard';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('simulation.use');
	return { fitHelp: GROWTH_FIT_HELP, minPoints: MIN_GROWTH_FIT_POINTS };
};
