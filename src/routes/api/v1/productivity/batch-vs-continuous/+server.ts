import { compareBatchWithContinuous } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';
import { batchVersusContinuousRequest } from '$lib/server/api/operations/simulation';

export const POST = endpoint(
	{ act: 'calculation.run', body: batchVersusContinuousRequest },
	({ body }) => compareBatchWithContinuous(body)
);
