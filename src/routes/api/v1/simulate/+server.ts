import { endpoint } from '$lib/server/api/endpoint';
import { simulateRequest } from '$lib/server/api/operations/simulation';
import { runSimulation } from '$lib/server/simulation';

export const POST = endpoint({ act: 'simulation.use', body: simulateRequest }, ({ body }) =>
	runSimulation(body)
);
