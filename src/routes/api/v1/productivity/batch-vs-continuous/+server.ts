import { batchVersusContinuousRequest } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';
import { runInPool } from '$lib/server/simulation-pool';

export const POST = endpoint(
	{ act: 'simulation.use', body: batchVersusContinuousRequest },
	({ body }) => runInPool('batchVersusContinuous', body)
);
