import { compareBatchWithContinuous, batchVersusContinuousRequest } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';

export const POST = endpoint(
	{ act: 'simulation.use', body: batchVersusContinuousRequest },
	({ body }) => compareBatchWithContinuous(body)
);
