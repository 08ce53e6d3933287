import { compareBatchWithContinuous, batchVersusContinuousRequest } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';

export const POST = endpoint(
	{ act: 'calculation.run', body: batchVersusContinuousRequest },
	({ body }) => compareBatchWithContinuous(body)
);
