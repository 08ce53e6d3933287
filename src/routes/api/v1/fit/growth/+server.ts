import { fitGrowthCurve, fitGrowthRequest } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';

export const POST = endpoint({ act: 'calculation.run', body: fitGrowthRequest }, ({ body }) =>
	fitGrowthCurve(body)
);
