import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api/endpoint';
import { scenarioCreateRequest } from '$lib/server/api/operations/simulation';
import { clientAddress } from '$lib/server/guard';
import { listScenarios, saveScenario } from '$lib/server/scenarios';

export const GET = endpoint({ act: 'simulation.use' }, ({ user }) => listScenarios(user!.id));

export const POST = endpoint(
	{ act: 'simulation.use', body: scenarioCreateRequest },
	({ user, body }) =>
		json(saveScenario({ ...user!, address: clientAddress() }, body), { status: 201 })
);
