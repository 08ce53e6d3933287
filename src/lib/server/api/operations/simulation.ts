import { z } from 'zod';
import {
	FEED_STRATEGIES,
	OPERATING_MODES,
	simulationRequestSchema,
	simulationResultSchema,
	type BatchVersusContinuous,
	type ChemostatSteadyState,
	type GrowthFit,
	type SimulationRequest,
	type SimulationResult
} from '$chemistry';
import type { ScenarioView } from '../../scenarios';
import type { ApiOperation } from '../openapi';
import { describes } from '../shapes';

// The simulation request and result are described once, beside the science
// (chemistry/simulation/request-schema.ts, result-schema.ts): the endpoint validates with the same
// schema the library reads, so every refusal names its field, and all of them are reported at once.
const finite = z.number({ error: 'Give a number.' });
const optionalNumber = finite.optional();
const series = z.array(z.number());

export const simulationModes = OPERATING_MODES;
export const feedStrategies = FEED_STRATEGIES;

export const simulateRequest = simulationRequestSchema;
export type SimulateRequest = SimulationRequest;
export const simulateResponse = describes<SimulationResult>()(simulationResultSchema);

const maintenance = finite
	.optional()
	.describe('Pirt maintenance coefficient m_s, g substrate / g biomass / h; default 0');

export const chemostatRequest = z.strictObject({
	muMaxPerH: finite,
	ksGPerL: finite,
	yieldXS: finite.describe('true growth yield Y_G, g biomass / g substrate'),
	feedSubstrateGPerL: finite,
	maintenanceGPerGH: maintenance,
	dilutionPerH: finite,
	safetyMargin: finite.optional().describe('fraction below D_crit, 0 ≤ margin < 1'),
	sweepPoints: z.int().optional()
});

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

export const batchVersusContinuousRequest = z.strictObject({
	muMaxPerH: finite,
	ksGPerL: finite,
	yieldXS: finite.describe('true growth yield Y_G, g biomass / g substrate'),
	maintenanceGPerGH: maintenance.describe(
		'Pirt maintenance coefficient m_s, g substrate / g biomass / h, in the batch and the chemostat; default 0'
	),
	substrateGPerL: finite.describe('batch initial substrate and chemostat feed, g/L'),
	inoculumGPerL: finite,
	dilutionPerH: finite,
	turnaround: z.strictObject({
		cleaningH: optionalNumber,
		sterilisingH: optionalNumber,
		fillingH: optionalNumber,
		lagH: optionalNumber
	}),
	conversion: finite.optional().describe('fraction of substrate used at harvest; default 0.99')
});

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

export const fitGrowthRequest = z.strictObject({
	timeH: z.array(finite).max(5000),
	biomassGPerL: z.array(finite).max(5000),
	substrateGPerL: z.array(finite).max(5000).optional(),
	dissolvedOxygenMgPerL: z.array(finite).max(5000).optional(),
	minRSquared: finite.optional(),
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
			'Simulates a batch, fed-batch, chemostat, perfusion or draw-fill run (Monod growth, Pirt maintenance, Luedeking–Piret product, optional O2 balance) and returns the series at the output times with the events. A run that cannot be integrated answers 422. Results are model estimates',
		act: 'calculation.run',
		request: simulateRequest,
		response: simulateResponse,
		errors: [422]
	},
	{
		method: 'post',
		path: '/api/v1/chemostat/steady-state',
		summary:
			'Monod chemostat steady state at a dilution rate (Herbert, Elsworth & Telling 1956) with optional Pirt (1965) maintenance: X = D·Y_G(S0 − S)/(D + m_s·Y_G), S, D·X, D_crit, D_opt (closed form without maintenance, golden-section search with it), washout, a sweep from D = 0 to D_crit, and the productivity lost to a safety margin below D_crit',
		act: 'calculation.run',
		request: chemostatRequest,
		response: chemostatResponse
	},
	{
		method: 'post',
		path: '/api/v1/productivity/batch-vs-continuous',
		summary:
			'Batch biomass productivity including turnaround (cleaning, sterilising, filling, lag) against chemostat productivity at the chosen D, as a ratio; Pirt maintenance, when given, applies to both',
		act: 'calculation.run',
		request: batchVersusContinuousRequest,
		response: batchVersusContinuousResponse
	},
	{
		method: 'post',
		path: '/api/v1/fit/growth',
		summary:
			'Fits run data: exponential phase (straight windows of ln X: R², lack of fit against the run’s noise, no significant bend), μmax and doubling time with Student-t 95 % intervals, Yx/s from −dX/dS, and μmax, Ks, Yx/s over the whole curve (needs substrate data) with 95 % intervals from the linearised covariance and warnings for poorly determined parameters. Data it cannot fit answer 400 naming the field and the test that failed',
		act: 'calculation.run',
		request: fitGrowthRequest,
		response: fitGrowthResponse
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
