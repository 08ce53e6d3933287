import { solveStoichiometry } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';
import { stoichiometryRequest } from '$lib/server/api/operations/chemistry';

export const POST = endpoint({ act: 'calculation.run', body: stoichiometryRequest }, ({ body }) =>
	solveStoichiometry(body)
);
