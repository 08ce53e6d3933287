import { z } from 'zod';
import {
	batchVersusContinuousRequest,
	batchVersusContinuousResponse,
	chemostatRequest,
	chemostatResponse,
	FEED_STRATEGIES,
	fitGrowthRequest,
	fitGrowthResponse,
	OPERATING_MODES,
	simulationRequestSchema,
	simulationResultSchema,
	type SimulationRequest,
	type SimulationResult
} from '$chemistry';
import type { ScenarioView } from '../../scenarios';
import type { ApiOperation } from '../openapi';
import { describes } from '../shapes';

// The science requests and results are described once, beside the science (chemistry/simulation/
// request-schema.ts, result-schema.ts, chemostat-schema.ts, productivity-schema.ts, growth-fit/
// schema.ts): the endpoint validates with the same schema the library reads and the browser panels
// check with, so every refusal names its field, and all of them are reported at once. Here are the
// operations' words for the OpenAPI document and the saved scenarios' own shapes.

export const simulationModes = OPERATING_MODES;
export const feedStrategies = FEED_STRATEGIES;

export const simulateRequest = simulationRequestSchema;
export type SimulateRequest = SimulationRequest;
export const simulateResponse = describes<SimulationResult>()(simulationResultSchema);

const scenarioName = z
	.string({ error: 'Give the scenario a name.' })
	.trim()
	.min(1, 'Give the scenario a name.')
	.max(120, 'Keep the name to 120 characters.');
const scenarioNotes = z.string().max(2000, 'Keep the notes to 2000 characters.');

export const scenarioCreateRequest = z.strictObject({
	name: scenarioName,
	notes: scenarioNotes.optional(),
	request: simulateRequest
});

export const scenarioUpdateRequest = z
	.strictObject({ name: scenarioName.optional(), notes: scenarioNotes.nullable().optional() })
	.refine(
		(body) => body.name !== undefined || body.notes !== undefined,
		'Send a new name or notes.'
	);

export const scenarioResponse = describes<ScenarioView>()(
	z.object({
		id: z.string(),
		name: z.string(),
		mode: z.enum(simulationModes),
		notes: z.string().nullable(),
		request: simulateRequest,
		createdAt: z.string(),
		updatedAt: z.string()
	})
);

export const simulationOperations: ApiOperation[] = [
	{
		method: 'post',
		path: '/api/v1/simulate',
		summary:
			'Simulates a batch, fed-batch, chemostat, perfusion or draw-fill run (Monod growth, Pirt maintenance, Luedeking–Piret product, optional O2 balance) and returns the series at the output times with the events. A run that cannot be integrated, or that runs past the site’s time limit, answers 422. Results are model estimates',
		act: 'simulation.use',
		request: simulateRequest,
		response: simulateResponse,
		errors: [422, 503]
	},
	{
		method: 'post',
		path: '/api/v1/chemostat/steady-state',
		summary:
			'Monod chemostat steady state at a dilution rate (Herbert, Elsworth & Telling 1956) with optional Pirt (1965) maintenance: X = D·Y_G(S0 − S)/(D + m_s·Y_G), S, D·X, D_crit, D_opt (closed form without maintenance, golden-section search with it), washout, a sweep from D = 0 to D_crit, and the productivity lost to a safety margin below D_crit',
		act: 'simulation.use',
		request: chemostatRequest,
		response: chemostatResponse,
		errors: [422, 503]
	},
	{
		method: 'post',
		path: '/api/v1/productivity/batch-vs-continuous',
		summary:
			'Batch biomass productivity including turnaround (cleaning, sterilising, filling, lag) against chemostat productivity at the chosen D, as a ratio; Pirt maintenance, when given, applies to both',
		act: 'simulation.use',
		request: batchVersusContinuousRequest,
		response: batchVersusContinuousResponse,
		errors: [422, 503]
	},
	{
		method: 'post',
		path: '/api/v1/fit/growth',
		summary:
			'Fits run data: exponential phase (straight windows of ln X: R², lack of fit against the run’s noise, no significant bend), μmax and doubling time with Student-t 95 % intervals, Yx/s from −dX/dS, and μmax, Ks, Yx/s over the whole curve (needs substrate data) with 95 % intervals from the linearised covariance and warnings for poorly determined parameters. Data it cannot fit answer 400 naming the field and the test that failed',
		act: 'simulation.use',
		request: fitGrowthRequest,
		response: fitGrowthResponse,
		errors: [422, 503]
	},
	{
		method: 'get',
		path: '/api/v1/scenarios',
		summary: 'The signed-in user’s saved simulation scenarios, newest first',
		act: 'simulation.use',
		response: z.array(scenarioResponse)
	},
	{
		method: 'post',
		path: '/api/v1/scenarios',
		summary: 'Saves a simulation scenario (name unique per user)',
		act: 'simulation.use',
		request: scenarioCreateRequest,
		response: scenarioResponse,
		successStatus: 201,
		errors: [409]
	},
	{
		method: 'get',
		path: '/api/v1/scenarios/{id}',
		summary: 'One of the signed-in user’s scenarios',
		act: 'simulation.use',
		response: scenarioResponse
	},
	{
		method: 'patch',
		path: '/api/v1/scenarios/{id}',
		summary: 'Renames a scenario or changes its notes',
		act: 'simulation.use',
		request: scenarioUpdateRequest,
		response: scenarioResponse,
		errors: [409]
	},
	{
		method: 'delete',
		path: '/api/v1/scenarios/{id}',
		summary: 'Deletes one of the signed-in user’s scenarios',
		act: 'simulation.use',
		successStatus: 204,
		responseDescription: 'Deleted'
	}
];
