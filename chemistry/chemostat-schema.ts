// The chemostat steady-state request and result, as the API and the browser panel validate them and
// the OpenAPI document shows them. Each number carries the range the science enforces (chemostat.ts),
// in the same words; the science keeps its own checks for its other callers.
import { z } from 'zod';
import {
	MAINTENANCE_BOUNDS,
	MAX_SWEEP_POINTS,
	MIN_SWEEP_POINTS,
	SAFETY_MARGIN_BOUNDS,
	type ChemostatSteadyState
} from './chemostat';
import { NON_NEGATIVE, POSITIVE } from './input';
import { describes } from './schema-binding';
import { boundedNumber, boundedWholeNumber, requiredNumber } from './simulation/request-bounds';

/** Pirt's m_s as both the chemostat and the batch-against-continuous requests take it. */
export const maintenanceInput = boundedNumber(MAINTENANCE_BOUNDS)
	.optional()
	.describe('Pirt maintenance coefficient m_s, g substrate / g biomass / h; default 0');

/** The Monod growth parameters both requests share. */
export const monodGrowthInputs = {
	muMaxPerH: requiredNumber(POSITIVE),
	ksGPerL: requiredNumber(POSITIVE),
	yieldXS: requiredNumber(POSITIVE).describe('true growth yield Y_G, g biomass / g substrate')
};

export const chemostatRequest = z.strictObject({
	...monodGrowthInputs,
	feedSubstrateGPerL: requiredNumber(POSITIVE),
	maintenanceGPerGH: maintenanceInput,
	dilutionPerH: requiredNumber(NON_NEGATIVE),
	safetyMargin: boundedNumber(SAFETY_MARGIN_BOUNDS)
		.optional()
		.describe('fraction below D_crit, 0 ≤ margin < 1'),
	sweepPoints: boundedWholeNumber(MIN_SWEEP_POINTS, MAX_SWEEP_POINTS).optional()
});

export type ChemostatRequest = z.infer<typeof chemostatRequest>;

const operatingPoint = z.object({
	dilutionPerH: z.number(),
	biomassGPerL: z.number(),
	substrateGPerL: z.number(),
	productivityGPerLH: z.number()
});

export const chemostatResponse = describes<ChemostatSteadyState>()(
	z.object({
		biomassGPerL: z.number(),
		substrateGPerL: z.number(),
		productivityGPerLH: z.number(),
		criticalDilutionPerH: z.number(),
		optimalDilutionPerH: z.number(),
		washout: z.boolean(),
		sweep: z.array(operatingPoint),
		marginDilutionPerH: z.number().optional(),
		productivityLostToMargin: z.number().optional()
	})
);
