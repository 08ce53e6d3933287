import { solveStoichiometry } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';
import { stoichiometryRequest } from '$lib/server/api/operations/chemistry';

export const POST = endpoint({ access: { roles: [] }, body: stoichiometryRequest }, ({ body }) => solveStoichiometry(body));
