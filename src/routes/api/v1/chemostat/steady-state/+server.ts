import { chemostatRequest } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';
import { runInPool } from '$lib/server/simulation-pool';

export const POST = endpoint({ act: 'simulation.use', body: chemostatRequest }, ({ body }) =>
	runInPool('chemostat', body)
);
