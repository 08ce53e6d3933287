import { fitGrowthCurve } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';
import { fitGrowthRequest } from '$lib/server/api/operations/simulation';

export const POST = endpoint({ act: 'calculation.run', body: fitGrowthRequest }, ({ body }) =>
	fitGrowthCurve(body)
);
