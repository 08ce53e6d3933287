// The growth-fit request and result, as the API validates and documents them. The fit's own checks
// (read.ts, fit.ts) read several fields at once (equal lengths, rising time, enough points) and stay
// with the science; the schema holds the shape and the ranges of single values, in the same words.
import { z } from 'zod';
import { describes } from '../schema-binding';
import { fieldOf } from '../simulation/request-bounds';
import { MAX_SERIES_POINTS, minRSquaredMessage } from './read';
import type { GrowthFit } from './types';

const finite = z.number({ error: 'Give a number.' });
const series = z.array(z.number());
const measured = z.array(finite).max(MAX_SERIES_POINTS);

export const fitGrowthRequest = z.strictObject({
	timeH: measured,
	biomassGPerL: measured,
	substrateGPerL: measured.optional(),
	dissolvedOxygenMgPerL: measured.optional(),
	minRSquared: finite
		.gt(0, { error: (issue) => minRSquaredMessage(fieldOf(issue.path)) })
		.lt(1, { error: (issue) => minRSquaredMessage(fieldOf(issue.path)) })
		.optional(),
	fitYield: z.boolean().optional()
});

const estimate = z.object({
	value: z.number(),
	standardError: z.number(),
	lower95: z.number().nullable().describe('95 % bound; null when unbounded'),
	upper95: z.number().nullable().describe('95 % bound; null when unbounded')
});

const parameterEstimate = z.object({
	value: z.number(),
	standardError: z
		.number()
		.nullable()
		.describe('θ·SE(ln θ); null when the data do not determine θ'),
	lower95: z.number().nullable().describe('95 % bound from ln θ; null when unbounded'),
	upper95: z.number().nullable().describe('95 % bound from ln θ; null when unbounded'),
	poorlyDetermined: z
		.boolean()
		.describe('the interval spans more than a factor of 3, or is unbounded')
});

export const fitGrowthResponse = describes<GrowthFit>()(
	z.object({
		exponentialPhase: z.object({
			startIndex: z.int(),
			endIndex: z.int(),
			startH: z.number(),
			endH: z.number(),
			pointCount: z.int(),
			rSquared: z.number(),
			longestStraightPointCount: z
				.int()
				.describe('the reported window holds at least 60 % of these points'),
			noiseSdLn: z.number().describe('measurement noise of ln X used by the window tests'),
			muMaxPerH: estimate.describe('slope of ln X over the window; Student-t interval'),
			doublingTimeH: estimate,
			curve: z.object({ t: series, biomassGPerL: series })
		}),
		oxygenLimitedIndices: z.array(z.int()),
		yieldXS: estimate.nullable().describe('−dX/dS; null without falling substrate data'),
		monodFit: z
			.object({
				muMaxPerH: z.number(),
				ksGPerL: z.number(),
				yieldXS: z.number(),
				initialBiomassGPerL: z.number().describe('at startH'),
				initialSubstrateGPerL: z.number().describe('at startH'),
				startH: z.number().describe('the fit starts at the exponential phase’s first point'),
				biomassRmsGPerL: z.number(),
				substrateRmsGPerL: z.number(),
				iterations: z.int(),
				estimates: z.object({
					muMaxPerH: parameterEstimate,
					ksGPerL: parameterEstimate,
					yieldXS: parameterEstimate.nullable().describe('null when Yx/s was held at −dX/dS')
				}),
				degreesOfFreedom: z.int(),
				curve: z.object({ t: series, biomassGPerL: series, substrateGPerL: series })
			})
			.nullable()
			.describe(
				'whole-curve Monod batch fit; null without substrate data or when it failed (see warnings)'
			),
		warnings: z.array(z.string()).describe('plain-words cautions, e.g. a poorly determined Ks')
	})
);
