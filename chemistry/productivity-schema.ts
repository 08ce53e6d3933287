// The batch-against-continuous request and result, as the API and the browser panel validate them
// and the OpenAPI document shows them. Each number carries the range the science enforces
// (productivity.ts, chemostat.ts), in the same words; the science keeps its own checks.
import { z } from 'zod';
import { maintenanceInput, monodGrowthInputs } from './chemostat-schema';
import { POSITIVE } from './input';
import {
	CONVERSION_BOUNDS,
	TURNAROUND_HOURS_BOUNDS,
	type BatchVersusContinuous
} from './productivity';
import { describes } from './schema-binding';
import { boundedNumber, requiredNumber } from './simulation/request-bounds';

const turnaroundHours = boundedNumber(TURNAROUND_HOURS_BOUNDS).optional();

export const batchVersusContinuousRequest = z.strictObject({
	...monodGrowthInputs,
	maintenanceGPerGH: maintenanceInput.describe(
		'Pirt maintenance coefficient m_s, g substrate / g biomass / h, in the batch and the chemostat; default 0'
	),
	substrateGPerL: requiredNumber(POSITIVE).describe(
		'batch initial substrate and chemostat feed, g/L'
	),
	inoculumGPerL: requiredNumber(POSITIVE),
	dilutionPerH: requiredNumber(POSITIVE),
	turnaround: z.strictObject({
		cleaningH: turnaroundHours,
		sterilisingH: turnaroundHours,
		fillingH: turnaroundHours,
		lagH: turnaroundHours
	}),
	conversion: boundedNumber(CONVERSION_BOUNDS)
		.optional()
		.describe('fraction of substrate used at harvest; default 0.99')
});

export type BatchVersusContinuousRequest = z.infer<typeof batchVersusContinuousRequest>;

export const batchVersusContinuousResponse = describes<BatchVersusContinuous>()(
	z.object({
		batch: z.object({
			growthTimeH: z.number(),
			turnaroundH: z.number(),
			cycleTimeH: z.number().describe('growth plus turnaround'),
			finalBiomassGPerL: z.number(),
			productivityGPerLH: z.number().describe('final biomass over the whole cycle')
		}),
		continuous: z.object({
			dilutionPerH: z.number(),
			biomassGPerL: z.number(),
			substrateGPerL: z.number(),
			productivityGPerLH: z.number(),
			washout: z.boolean()
		}),
		continuousToBatchRatio: z.number().describe('continuous over batch productivity'),
		textbookRatioEstimate: z
			.number()
			.describe(
				'ln(Xm/X0) + μmax·t_turnaround with Xm = X0 + Y·S0: the Ks ≪ S0 estimate of the best attainable ratio without maintenance'
			)
	})
);
