import { MAX_END_H, MAX_OUTPUT_POINTS, SIMULATION_MODEL_HELP } from '$chemistry';
import { requireRole } from '$lib/server/guard';
import { listScenarios } from '$lib/server/scenarios';
import { SIMULATION_ROLES } from '$lib/simulation/roles';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const user = requireRole(...SIMULATION_ROLES);
	return {
		scenarios: listScenarios(user.id),
		modelHelp: SIMULATION_MODEL_HELP,
		limits: { maxEndH: MAX_END_H, maxOutputPoints: MAX_OUTPUT_POINTS }
	};
};
