// The requests `npm run api:record` sends to a running server (the demo data) and records in
// tests/api-recordings/<operationId>.json: one per GET operation and per POST that changes nothing.
// A new operation gets an entry here; a write can get one too, recorded against a database
// that may be changed.

/** Records the recorder finds on the server before it sends the requests below. */
export interface Found {
	recipeId: string;
	approvedN: string;
	studyId: string;
	lotId: string;
	batchId: string;
	runId: string;
	scenarioId: string;
	profileId: string;
	vesselId: string;
}

/** Sends a request as the default caller and answers its JSON (for a body made from another answer). */
export type Send = (method: string, path: string, body?: unknown) => Promise<unknown>;

export interface RecordedRequest {
	method: 'get' | 'post' | 'put' | 'patch' | 'delete';
	/** the operation's path template, as in the document */
	template: string;
	/** for a second recording of one operation: written as `<operationId>.<variant>.json` */
	variant?: string;
	params?: (found: Found) => Record<string, string>;
	query?: Record<string, string>;
	body?: unknown;
	/** a body worked out at recording time, e.g. from another answer */
	bodyFrom?: (found: Found, send: Send) => Promise<unknown>;
	/** an administrator sends it (the audit trail) */
	asAdmin?: boolean;
}

const batchRun = {
	mode: 'batch',
	kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5 },
	initial: { biomassGPerL: 0.05, substrateGPerL: 10, volumeL: 1 },
	endH: 14,
	outputEveryH: 0.5
};

const fedBatchWithOxygen = {
	mode: 'fedBatch',
	kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5, yieldXO2: 1 },
	initial: { biomassGPerL: 0.5, substrateGPerL: 1, volumeL: 1 },
	feeds: [
		{ label: 'Glucose', strategy: 'constant', substrateGPerL: 300, rateLPerH: 0.02 },
		{ label: 'Amino acids', strategy: 'constant', substrateGPerL: 0, rateLPerH: 0.01, startH: 4 }
	],
	oxygen: { kLaPerH: 200, saturationMgPerL: 7 },
	maxVolumeL: 1.3,
	endH: 10,
	outputEveryH: 1
};

export const EXAMPLE_SCENARIO = { name: 'API recording: fed-batch with oxygen', request: batchRun };

/**
 * GET operations left out on purpose, with why: tests/server/api-recordings.test.ts asks every
 * other GET operation for a recording.
 */
export const NOT_RECORDED: Record<string, string> = {
	getOpenapiJson:
		'the document is checked whole by openapi-complete.test.ts; a copy would change with every operation'
};

const id = (key: keyof Found) => (found: Found) => ({ id: found[key] });

export const RECORDED_REQUESTS: RecordedRequest[] = [
	{ method: 'get', template: '/api/v1/health' },
	{ method: 'get', template: '/api/v1/me' },
	{ method: 'post', template: '/api/v1/formula', body: { formula: 'MgSO4·7H2O' } },
	{
		method: 'post',
		template: '/api/v1/stoichiometry',
		body: {
			species: [
				{ id: 'glucose', formula: 'C6H12O6' },
				{ id: 'ammonia', formula: 'NH3' },
				{ id: 'oxygen', formula: 'O2' },
				{ id: 'biomass', formula: 'CH1.8O0.5N0.2', ashFraction: 0.05, role: 'biomass' },
				{ id: 'co2', formula: 'CO2' },
				{ id: 'water', formula: 'H2O' }
			],
			specifications: [
				{ kind: 'rate', species: 'glucose', mol: -1 },
				{ kind: 'massYield', product: 'biomass', substrate: 'glucose', gPerG: 0.5 },
				{ kind: 'molarRatio', numerator: 'co2', denominator: 'oxygen', value: 1.05 }
			]
		}
	},
	{
		method: 'post',
		template: '/api/v1/oxygen/saturation',
		body: { temperatureC: 37, salinityGPerKg: 5 }
	},
	{
		method: 'post',
		template: '/api/v1/sufficiency',
		body: {
			profile: { kind: 'preset', id: 'bacterium-neidhardt-1990' },
			target: { biomassGPerL: 1.5 },
			supply: {
				sources: [
					{
						name: 'M9',
						elementsGPerL: { N: 0.26, P: 2.2, Mg: 0.05 },
						componentsGPerL: { glucose: 4 }
					}
				]
			},
			carbon: { basis: 'component', component: 'glucose', yieldGPerG: 0.5 }
		}
	},
	{ method: 'get', template: '/api/v1/recipes', query: { status: 'approved', limit: '3' } },
	{ method: 'get', template: '/api/v1/recipes/{id}', params: id('recipeId') },
	{
		method: 'get',
		template: '/api/v1/recipes/{id}/versions/{n}',
		params: (found) => ({ id: found.recipeId, n: found.approvedN })
	},
	{
		method: 'post',
		template: '/api/v1/recipes/preview',
		body: {
			preparationTemperatureC: 25,
			osmolalityMinMOsmPerKg: 250,
			osmolalityMaxMOsmPerKg: 350,
			lines: [
				{ componentId: 'sodium-chloride', amount: 5, unit: 'g/L' },
				{ componentId: 'd-glucose', amount: 10, unit: 'g/L' },
				{ componentId: 'no-such-component', amount: 1, unit: 'g/L' }
			]
		}
	},
	{ method: 'get', template: '/api/v1/components', query: { q: 'sulfate', limit: '3' } },
	{ method: 'get', template: '/api/v1/components/{id}', params: () => ({ id: 'sodium-chloride' }) },
	{ method: 'get', template: '/api/v1/profiles', query: { limit: '3' } },
	{ method: 'get', template: '/api/v1/profiles/{id}', params: id('profileId') },
	{ method: 'get', template: '/api/v1/vessels', query: { limit: '3' } },
	{ method: 'get', template: '/api/v1/vessels/{id}', params: id('vesselId') },
	{ method: 'post', template: '/api/v1/simulate', body: fedBatchWithOxygen },
	{
		method: 'post',
		template: '/api/v1/chemostat/steady-state',
		body: {
			muMaxPerH: 0.6,
			ksGPerL: 0.05,
			yieldXS: 0.5,
			feedSubstrateGPerL: 20,
			dilutionPerH: 0.4,
			safetyMargin: 0.1
		}
	},
	{
		method: 'post',
		template: '/api/v1/productivity/batch-vs-continuous',
		body: {
			muMaxPerH: 0.6,
			ksGPerL: 0.05,
			yieldXS: 0.5,
			substrateGPerL: 20,
			inoculumGPerL: 0.1,
			dilutionPerH: 0.4,
			turnaround: { cleaningH: 2, sterilisingH: 1, fillingH: 1, lagH: 1 }
		}
	},
	{
		method: 'post',
		template: '/api/v1/fit/growth',
		// Run data from the simulator, with a small fixed ripple so the fit sees measurement noise.
		bodyFrom: async (_found, send) => {
			const run = (await send('post', '/api/v1/simulate', batchRun)) as Record<string, number[]>;
			const ripple = (values: number[]) => values.map((v, i) => v * (1 + 0.01 * Math.sin(7 * i)));
			return {
				timeH: run.t,
				biomassGPerL: ripple(run.biomassGPerL),
				substrateGPerL: ripple(run.substrateGPerL)
			};
		}
	},
	{ method: 'get', template: '/api/v1/scenarios' },
	{ method: 'get', template: '/api/v1/scenarios/{id}', params: id('scenarioId') },
	{ method: 'get', template: '/api/v1/lots', query: { status: 'released', limit: '3' } },
	{ method: 'get', template: '/api/v1/lots/{id}', params: id('lotId') },
	{
		method: 'get',
		template: '/api/v1/lots/{id}/ledger',
		params: id('lotId'),
		query: { limit: '5' }
	},
	{ method: 'get', template: '/api/v1/batches', query: { state: 'released', limit: '3' } },
	{ method: 'get', template: '/api/v1/batches/{id}', params: id('batchId') },
	{ method: 'get', template: '/api/v1/studies', query: { limit: '3' } },
	{ method: 'get', template: '/api/v1/studies/{id}', params: id('studyId') },
	{
		method: 'post',
		template: '/api/v1/studies/evaluate',
		bodyFrom: async (found) => ({ studyId: found.studyId, whatIf: { kLaPerH: 250 } })
	},
	{
		method: 'post',
		template: '/api/v1/studies/{id}/feed-design',
		params: id('studyId'),
		body: {
			componentIds: [
				'd-glucose',
				'ammonium-sulfate',
				'calcium-chloride',
				'iron-ii-sulfate',
				'sodium-dihydrogen-phosphate',
				'magnesium-sulfate'
			],
			feedVolumeL: 30,
			temperatureC: 25
		}
	},
	{ method: 'get', template: '/api/v1/runs', query: { limit: '3' } },
	{ method: 'get', template: '/api/v1/runs/{id}', params: id('runId') },
	{
		method: 'get',
		template: '/api/v1/runs/{id}/data',
		params: id('runId'),
		query: { limit: '5' }
	},
	{
		method: 'get',
		template: '/api/v1/runs/{id}/data',
		variant: 'csv',
		params: id('runId'),
		query: { format: 'csv' }
	},
	{ method: 'get', template: '/api/v1/runs/{id}/analysis', params: id('runId') },
	{ method: 'get', template: '/api/v1/audit', query: { limit: '5' }, asAdmin: true }
];
