import { MAX_END_H, MAX_OUTPUT_POINTS, SIMULATION_MODEL_HELP } from '$chemistry';
import { requirePermission } from '$lib/server/guard';
import { listScenarios } from '$lib/server/scenarios';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const user = requirePermission('simulation.use');
	return {
		scenarios: listScenarios(user.id),
		modelHelp: SIMULATION_MODEL_HELP,
		limits: { maxEndH: MAX_END_H, maxOutputPoints: MAX_OUTPUT_POINTS }
	};
};
