// The dissolved-oxygen saturation request and result, as the API validates and documents them.
import { z } from 'zod';
import { AIR_O2_MOLE_FRACTION } from './data/oxygen-solubility';
import type { OxygenSaturationResult } from './oxygen-saturation';
import { describes } from './schema-binding';

const finite = z.number({ error: 'Give a number.' });

const oxygenMethod = z.enum(['benson-krause-1984', 'garcia-gordon-1992']);

export const oxygenSaturationRequest = z.strictObject({
	temperatureC: finite,
	salinityGPerKg: finite.optional(),
	pressureKPa: finite.optional(),
	o2MoleFraction: finite
		.optional()
		.describe(`O2 mole fraction of the dry gas, 0–1; default air, ${AIR_O2_MOLE_FRACTION}`),
	method: oxygenMethod.optional()
});

const range = z.tuple([z.number(), z.number()]);

export const oxygenSaturationResponse = describes<OxygenSaturationResult>()(
	z.object({
		mgPerL: z.number(),
		mmolPerL: z.number(),
		umolPerKg: z.number().optional().describe('native Garcia–Gordon basis; only for that method'),
		airSaturationMgPerL: z
			.number()
			.describe(
				'C* for air at the same temperature, salinity and pressure (the 100 % of a DO probe)'
			),
		method: oxygenMethod,
		validRange: z
			.object({ temperatureC: range, salinityGPerKg: range, source: z.string() })
			.describe('where the method’s fit holds, [min, max]'),
		temperatureC: z.number(),
		salinityGPerKg: z.number(),
		pressureKPa: z.number(),
		o2MoleFraction: z.number(),
		waterVapourPressureKPa: z.number(),
		pressureFactor: z.number().describe('factor from 1 atm to pressureKPa (APHA/USGS)')
	})
);
