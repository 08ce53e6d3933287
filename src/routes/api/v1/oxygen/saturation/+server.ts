import { computeOxygenSaturation } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';
import { oxygenSaturationRequest } from '$lib/server/api/operations/chemistry';

export const POST = endpoint({ access: { roles: [] }, body: oxygenSaturationRequest }, ({ body }) => {
	const { oxygenMoleFraction, ...rest } = body;
	const result = computeOxygenSaturation({ ...rest, o2MoleFraction: oxygenMoleFraction ?? 0.2095 });
	const { o2MoleFraction, ...shown } = result;
	return { ...shown, oxygenMoleFraction: o2MoleFraction };
});
