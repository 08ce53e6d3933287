import { computeChemostatSteadyState } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';
import { chemostatRequest } from '$lib/server/api/operations/simulation';

export const POST = endpoint({ act: 'calculation.run', body: chemostatRequest }, ({ body }) =>
	computeChemostatSteadyState(body)
);
