import { assessSufficiency } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';
import { sufficiencyRequest } from '$lib/server/api/operations/chemistry';

export const POST = endpoint({ act: 'calculation.run', body: sufficiencyRequest }, ({ body }) =>
	assessSufficiency(body)
);
