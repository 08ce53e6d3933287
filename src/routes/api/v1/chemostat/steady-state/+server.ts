import { computeChemostatSteadyState } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';
import { chemostatRequest } from '$lib/server/api/operations/simulation';

export const POST = endpoint({ access: { roles: [] }, body: chemostatRequest }, ({ body }) => computeChemostatSteadyState(body));
