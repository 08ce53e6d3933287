import { fitGrowthRequest } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';
import { runInPool } from '$lib/server/simulation-pool';

export const POST = endpoint({ act: 'simulation.use', body: fitGrowthRequest }, ({ body }) =>
	runInPool('growthFit', body)
);
