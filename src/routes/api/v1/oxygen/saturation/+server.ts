import { computeOxygenSaturation, oxygenSaturationRequest } from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';

// An absent o2MoleFraction is dry air, AIR_O2_MOLE_FRACTION, by the library's own default.
export const POST = endpoint(
	{ act: 'calculation.run', body: oxygenSaturationRequest },
	({ body }) => computeOxygenSaturation(body)
);
