import { assessSufficiency, sufficiencyRequest } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';

export const POST = endpoint({ act: 'calculation.run', body: sufficiencyRequest }, ({ body }) =>
	assessSufficiency(body)
);
