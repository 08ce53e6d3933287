export { simulateRun, MAX_STEPS_PER_SEGMENT, NEGATIVE_STATE_TOLERANCE } from './simulate';
export { SimulationFailedError, type SimulationFailureReason } from './errors';
export {
	SIMULATION_MODEL_HELP,
	ABSOLUTE_TOLERANCE,
	RELATIVE_TOLERANCE,
	OXYGEN_LIMITED_FRACTION_OF_SATURATION,
	OXYGEN_QUASI_STEADY_RATIO,
	WASHOUT_FRACTION,
	computeExhaustionThresholdGPerL
} from './model';
export {
	compileFeedExpression,
	FEED_EXPRESSION_VARIABLES,
	type FeedExpression
} from './expression';
export { SUBSTRATE_STAT_GAIN_PER_MU_MAX, DO_STAT_BAND_FRACTION } from './feeding';
export {
	MAX_END_H,
	MAX_OUTPUT_POINTS,
	DEFAULT_OUTPUT_INTERVALS,
	MAX_DRAW_CYCLES,
	MAX_FEED_STREAMS,
	MAX_FEED_LABEL_LENGTH,
	OPERATING_MODES,
	FEED_STRATEGIES,
	simulationRequestSchema
} from './request-schema';
export { simulationResultSchema, SIMULATION_EVENT_KINDS } from './result-schema';
export { readSimulationRequest } from './validate';
export { defaultOutputEveryH } from './request-rules';
export type * from './types';
