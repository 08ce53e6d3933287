import { fitGrowthCurve, fitGrowthRequest } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';

export const POST = endpoint({ act: 'simulation.use', body: fitGrowthRequest }, ({ body }) =>
	fitGrowthCurve(body)
);
