// The simulation result's one description: `SimulationResult` is inferred from it and the API
// documents (and its tests check) `POST /api/v1/simulate` answers with it.
import { z } from 'zod';
import { FEED_STRATEGIES } from './request-schema';

export const SIMULATION_EVENT_KINDS = [
	'substrateExhausted',
	'oxygenLimited',
	'oxygenDepleted',
	'maxVolumeReached',
	'washout',
	'feedStarted',
	'draw'
] as const;

const series = z.array(z.number());
const stretches = z.array(z.object({ fromH: z.number(), toH: z.number() }));

export const simulationEventSchema = z.object({
	kind: z.enum(SIMULATION_EVENT_KINDS),
	tH: z.number(),
	message: z.string()
});

export const feedStreamResultSchema = z.object({
	label: z.string().nullable(),
	strategy: z.enum(FEED_STRATEGIES),
	feedLPerH: series
		.nullable()
		.describe(
			'this stream’s rate at each output time (0 before its start), L/h; null when the run has one stream, whose rate is the run’s feedLPerH'
		),
	deliveredL: z
		.number()
		.describe(
			'volume added by the stream over the run, bolus included (integrated with the run, not from the outputs)'
		)
});

export const simulationResultSchema = z.object({
	t: series.describe('h'),
	biomassGPerL: series,
	substrateGPerL: series,
	productGPerL: series,
	volumeL: series,
	dissolvedOxygenMgPerL: series
		.nullable()
		.describe('null when the request has no oxygen block: no O2 balance is solved'),
	feedLPerH: series.describe(
		'total inflow at each output time (the sum of the feed streams, or dilution/perfusion flow), L/h; draws are discrete and not shown'
	),
	feedStreams: z
		.array(feedStreamResultSchema)
		.nullable()
		.describe(
			'fed-batch: each feed stream in request order (the single feed as one); null in other modes'
		),
	ourMmolPerLH: series
		.nullable()
		.describe(
			'mmol/L/h: the uptake with an oxygen block (held to kLa·C* where DO is at 0); without one but with kinetics.yieldXO2, the O2 demand of the simulated growth; otherwise null'
		),
	maxOtrMmolPerLH: z
		.number()
		.nullable()
		.describe(
			'kLa·C*, mmol/L/h: one figure for the whole run (kLa and C* do not change in it); null without an oxygen block'
		),
	events: z.array(simulationEventSchema),
	tolerances: z.object({ absolute: z.number(), relative: z.number() }),
	quasiSteadyOxygenH: stretches
		.nullable()
		.describe(
			'stretches in which DO relaxed so fast that its balance was solved at quasi-steady state (dC/dt = 0) rather than integrated; null without an oxygen block'
		),
	oxygenLimitedH: stretches
		.nullable()
		.describe(
			'stretches with DO held at 0 and growth at what transfer supplies (OTR = OUR at DO = 0); null without an oxygen block'
		),
	stoppedAtH: z
		.number()
		.optional()
		.describe('set when the run ended before endH: the maximum working volume was reached'),
	integratorSteps: z.object({ accepted: z.int(), rejected: z.int(), evaluations: z.int() })
});

export type SimulationEventKind = (typeof SIMULATION_EVENT_KINDS)[number];
export type SimulationEvent = z.infer<typeof simulationEventSchema>;
export type FeedStreamResult = z.infer<typeof feedStreamResultSchema>;
export type IntegratorTolerances = SimulationResult['tolerances'];
export type SimulationResult = z.infer<typeof simulationResultSchema>;
