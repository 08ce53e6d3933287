// The simulation request's one description: its types are inferred from these schemas, the API
// validates bodies with them and the OpenAPI document is generated from them. Ranges of single
// fields sit on the fields; rules that read several fields are in request-rules.ts.
import { z } from 'zod';
import { checkSimulationRequest } from './request-rules';
import { fieldLabel } from '../field-labels';
import {
	boundedNumber,
	DEFAULT_OUTPUT_INTERVALS,
	DILUTION_BOUNDS,
	END_H_BOUNDS,
	fieldOf,
	givenNumber,
	MAX_FEED_LABEL_LENGTH,
	MAX_FEED_STREAMS,
	MAX_OUTPUT_POINTS,
	MU_MAX_BOUNDS,
	NON_NEGATIVE,
	POSITIVE,
	SATURATION_BOUNDS,
	YIELD_BOUNDS
} from './request-bounds';

export {
	MAX_DRAW_CYCLES,
	MAX_END_H,
	MAX_FEED_LABEL_LENGTH,
	MAX_FEED_STREAMS,
	MAX_OUTPUT_POINTS,
	DEFAULT_OUTPUT_INTERVALS
} from './request-bounds';

export const OPERATING_MODES = ['batch', 'fedBatch', 'chemostat', 'perfusion', 'drawFill'] as const;
export const FEED_STRATEGIES = [
	'constant',
	'linear',
	'exponential',
	'substrateStat',
	'doStat',
	'expression'
] as const;

const feedLabel = z
	.string()
	.refine((label) => label.trim() !== '' && label.trim().length <= MAX_FEED_LABEL_LENGTH, {
		error: (issue) => labelMessage(fieldOf(issue.path), String(issue.input))
	});

function labelMessage(field: string, input: string): string {
	const length = input.trim().length;
	const label = fieldLabel(field);
	return length === 0
		? `${label} must be a non-empty text.`
		: `${label} must be at most ${MAX_FEED_LABEL_LENGTH} characters (got ${length}).`;
}

/**
 * One feed stream. Which of the rate fields a stream needs, and their ranges, depend on its strategy
 * and the mode (request-rules.ts).
 */
export const feedInputSchema = z.strictObject({
	strategy: z.enum(FEED_STRATEGIES),
	label: feedLabel
		.optional()
		.describe(
			'fed-batch only: names the stream in events and in `feedStreams`; at most 80 characters'
		),
	substrateGPerL: givenNumber.describe(
		'substrate in the feed (or the fresh medium in chemostat, perfusion and draw-fill), g/L; a stream of `feeds` may carry none (0) unless it is exponential or substrate-stat'
	),
	rateLPerH: givenNumber.optional(),
	slopeLPerH2: givenNumber.optional(),
	muSetPerH: givenNumber.optional(),
	setpointGPerL: givenNumber.optional(),
	doSetpointMgPerL: givenNumber.optional(),
	expression: z.string().max(2000).optional().describe('arithmetic in t, X, S, P, V, DO'),
	startH: boundedNumber(NON_NEGATIVE).optional(),
	bolusL: boundedNumber(NON_NEGATIVE).optional(),
	maxRateLPerH: boundedNumber(POSITIVE).optional()
});

export const kineticsInputSchema = z.strictObject({
	muMaxPerH: boundedNumber(MU_MAX_BOUNDS).describe('1/h'),
	ksGPerL: boundedNumber(POSITIVE).describe('g/L'),
	yieldXS: boundedNumber(YIELD_BOUNDS).describe('g biomass / g substrate'),
	maintenanceGPerGH: boundedNumber(NON_NEGATIVE)
		.optional()
		.describe('substrate for maintenance (Pirt), g substrate / g biomass / h'),
	yieldXO2: boundedNumber(YIELD_BOUNDS)
		.optional()
		.describe(
			'g biomass / g O2; required with oxygen. Without oxygen, the result’s ourMmolPerLH is the O2 demand of the simulated growth (transfer unlimited)'
		),
	koMgPerL: boundedNumber(NON_NEGATIVE)
		.optional()
		.describe(
			'O2 half-saturation constant, mg/L: above 0, growth slows as DO falls (C/(K_O + C)); at 0, growth runs at full speed until DO reaches 0 and then at the rate transfer can supply'
		),
	alpha: boundedNumber(NON_NEGATIVE)
		.optional()
		.describe('Luedeking–Piret growth-associated term, g product / g biomass'),
	beta: boundedNumber(NON_NEGATIVE)
		.optional()
		.describe('Luedeking–Piret non-growth term, g product / g biomass / h')
});

export const initialStateInputSchema = z.strictObject({
	biomassGPerL: boundedNumber(POSITIVE),
	substrateGPerL: boundedNumber(NON_NEGATIVE),
	volumeL: boundedNumber(POSITIVE),
	dissolvedOxygenMgPerL: boundedNumber(NON_NEGATIVE)
		.optional()
		.describe('defaults to oxygen.saturationMgPerL'),
	productGPerL: boundedNumber(NON_NEGATIVE).optional()
});

export const oxygenInputSchema = z.strictObject({
	kLaPerH: boundedNumber({ ...POSITIVE, max: 1e4 }),
	saturationMgPerL: boundedNumber(SATURATION_BOUNDS),
	maintenanceMgPerGH: boundedNumber(NON_NEGATIVE)
		.optional()
		.describe('O2 for maintenance, mg O2 / g biomass / h'),
	limitsGrowth: z
		.boolean()
		.optional()
		.describe(
			'default true. false: DO is followed (a DO-stat feed reads it, and it is held at 0 where transfer falls short) but never slows growth, so ourMmolPerLH is the demand of the plan as written, not what this kLa supplies; kinetics.koMgPerL must then be absent'
		)
});

export const perfusionInputSchema = z.strictObject({
	retentionEfficiency: boundedNumber({
		min: 0,
		minInclusive: true,
		max: 1,
		maxInclusive: true
	}).describe('fraction of cells the retention device holds back from the harvest stream, 0–1'),
	bleedPerH: boundedNumber(NON_NEGATIVE).describe(
		'cell bleed, vessel volumes per hour (leaves with the culture’s full biomass)'
	)
});

export const drawFillInputSchema = z.strictObject({
	fraction: boundedNumber({ min: 0, max: 1 }).describe(
		'fraction of the working volume withdrawn and replaced with fresh medium at each draw'
	),
	everyH: boundedNumber(POSITIVE)
});

/** The request's fields and their own ranges, before the rules that read several fields. */
export const simulationRequestShape = z.strictObject({
	mode: z.enum(OPERATING_MODES),
	kinetics: kineticsInputSchema,
	initial: initialStateInputSchema,
	feed: feedInputSchema.optional(),
	feeds: z
		.array(feedInputSchema)
		.min(1, `feeds must be a list of 1 to ${MAX_FEED_STREAMS} feed streams (got 0).`)
		.max(MAX_FEED_STREAMS, `Give at most ${MAX_FEED_STREAMS} feed streams.`)
		.optional()
		.describe(
			'fedBatch only, instead of feed: several streams, each with its own strategy and start'
		),
	oxygen: oxygenInputSchema.optional().describe('absent: no O2 balance and no O2 limitation'),
	perfusion: perfusionInputSchema.optional(),
	drawFill: drawFillInputSchema.optional(),
	dilutionPerH: boundedNumber(DILUTION_BOUNDS).optional(),
	maxVolumeL: boundedNumber(POSITIVE).optional(),
	endH: boundedNumber(END_H_BOUNDS),
	outputEveryH: boundedNumber(POSITIVE)
		.optional()
		.describe(
			`h between output points; absent: the smallest round step (1, 2 or 5 × 10ⁿ h) giving at most ${DEFAULT_OUTPUT_INTERVALS} intervals. At most ${MAX_OUTPUT_POINTS} points.`
		)
});

export const simulationRequestSchema = simulationRequestShape.superRefine(checkSimulationRequest);

export type OperatingMode = (typeof OPERATING_MODES)[number];
export type FeedStrategy = (typeof FEED_STRATEGIES)[number];
export type FeedInput = z.infer<typeof feedInputSchema>;
export type KineticsInput = z.infer<typeof kineticsInputSchema>;
export type InitialStateInput = z.infer<typeof initialStateInputSchema>;
export type OxygenInput = z.infer<typeof oxygenInputSchema>;
export type PerfusionInput = z.infer<typeof perfusionInputSchema>;
export type DrawFillInput = z.infer<typeof drawFillInputSchema>;
export type SimulationRequest = z.infer<typeof simulationRequestSchema>;
