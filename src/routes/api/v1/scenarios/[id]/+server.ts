import { endpoint } from '$lib/server/api/endpoint';
import { scenarioUpdateRequest } from '$lib/server/api/operations/simulation';
import { clientAddress } from '$lib/server/guard';
import { deleteScenario, getScenario, updateScenario } from '$lib/server/scenarios';
import { SIMULATION_ROLES } from '$lib/simulation/roles';

const access = { roles: [...SIMULATION_ROLES] };

export const GET = endpoint({ access }, ({ user, event }) => getScenario(user!.id, event.params.id!));

export const PATCH = endpoint({ access, body: scenarioUpdateRequest }, ({ user, event, body }) =>
	updateScenario({ ...user!, address: clientAddress() }, event.params.id!, body)
);

export const DELETE = endpoint({ access }, ({ user, event }) => {
	deleteScenario({ ...user!, address: clientAddress() }, event.params.id!);
	return new Response(null, { status: 204 });
});
