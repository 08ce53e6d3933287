// Request and result shapes of the process simulation, inferred from their schemas (request-schema.ts,
// result-schema.ts); `POST /api/v1/simulate` validates its body with the same request schema.
export type {
	DrawFillInput,
	FeedInput,
	FeedStrategy,
	InitialStateInput,
	KineticsInput,
	OperatingMode,
	OxygenInput,
	PerfusionInput,
	SimulationRequest
} from './request-schema';
export type {
	FeedStreamResult,
	IntegratorTolerances,
	SimulationEvent,
	SimulationEventKind,
	SimulationResult
} from './result-schema';
