import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api/endpoint';
import { scenarioCreateRequest } from '$lib/server/api/operations/simulation';
import { clientAddress } from '$lib/server/guard';
import { listScenarios, saveScenario } from '$lib/server/scenarios';
import { SIMULATION_ROLES } from '$lib/simulation/roles';

export const GET = endpoint({ access: { roles: [...SIMULATION_ROLES] } }, ({ user }) => listScenarios(user!.id));

export const POST = endpoint({ access: { roles: [...SIMULATION_ROLES] }, body: scenarioCreateRequest }, ({ user, body }) =>
	json(saveScenario({ ...user!, address: clientAddress() }, body), { status: 201 })
);
