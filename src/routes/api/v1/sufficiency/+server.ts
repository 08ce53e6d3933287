import { assessSufficiency } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';
import { sufficiencyRequest } from '$lib/server/api/operations/chemistry';

export const POST = endpoint({ access: { roles: [] }, body: sufficiencyRequest }, ({ body }) => assessSufficiency(body));
