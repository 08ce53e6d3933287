import { computeChemostatSteadyState, chemostatRequest } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';

export const POST = endpoint({ act: 'simulation.use', body: chemostatRequest }, ({ body }) =>
	computeChemostatSteadyState(body)
);
