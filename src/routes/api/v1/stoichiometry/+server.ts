import { solveStoichiometry, stoichiometryRequest } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';

export const POST = endpoint({ act: 'calculation.run', body: stoichiometryRequest }, ({ body }) =>
	solveStoichiometry(body)
);
