import { endpoint } from '$lib/server/api/endpoint';
import { scenarioUpdateRequest } from '$lib/server/api/operations/simulation';
import { clientAddress } from '$lib/server/guard';
import { deleteScenario, getScenario, updateScenario } from '$lib/server/scenarios';

export const GET = endpoint({ act: 'simulation.use' }, ({ user, event }) =>
	getScenario(user!.id, event.params.id!)
);

export const PATCH = endpoint(
	{ act: 'simulation.use', body: scenarioUpdateRequest },
	({ user, event, body }) =>
		updateScenario({ ...user!, address: clientAddress() }, event.params.id!, body)
);

export const DELETE = endpoint({ act: 'simulation.use' }, ({ user, event }) => {
	deleteScenario({ ...user!, address: clientAddress() }, event.params.id!);
	return new Response(null, { status: 204 });
});
