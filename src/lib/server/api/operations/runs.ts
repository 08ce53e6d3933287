import { z } from 'zod';
import { RUN_SIGNAL_NAMES, TIME_COLUMNS, type RunSignal } from '$lib/runs/signals';
import { RUN_STATES } from '$lib/runs/states';
import { keysetFields, keysetPageSchema, type KeysetPage } from '../../keyset';
import { pagingFields } from '../../list-paging';
import type { RunAnalysis } from '../../runs/run-analysis';
import { RUN_SORTS, type RunListRow } from '../../runs/run-list';
import type { DataPage } from '../../runs/series-read';
import { CONFLICT_RULES, type StoreOutcome } from '../../runs/store-points';
import type { ApiOperation } from '../openapi';
import { describes, isoTime } from '../shapes';

const RUN_LIST_ORDER = { sort: 'startedAt', dir: 'desc' } as const;

const runFilterFields = {
	q: z
		.string()
		.max(120)
		.optional()
		.describe('Part of the run number or name, the study or the vessel')
};

/** The API's run list: the search, a page at a time by cursor. */
export const runListQuery = z.object({
	...runFilterFields,
	...keysetFields(RUN_SORTS, RUN_LIST_ORDER)
});

/** The runs page: the same search, paged by number. */
export const runPageQuery = z.object({
	...runFilterFields,
	...pagingFields(RUN_SORTS, RUN_LIST_ORDER)
});

export const runListResponse = describes<KeysetPage<RunListRow>>()(
	keysetPageSchema(
		z.object({
			id: z.string(),
			number: z.string(),
			name: z.string(),
			state: z.enum(RUN_STATES),
			startedAt: isoTime(),
			endedAt: isoTime().nullable(),
			studyId: z.string(),
			studyName: z.string(),
			vesselName: z.string(),
			profileName: z.string()
		}),
		'run'
	)
);

const point = z
	.record(z.string(), z.union([z.number(), z.string(), z.null()]))
	.describe(
		`One time and its readings: exactly one time key (${Object.keys(TIME_COLUMNS).join(', ')}: elapsed since the run started, or an ISO 8601 timestamp with its zone) and any of the signals ${RUN_SIGNAL_NAMES.join(', ')}; a missing or null signal is not read at that time`
	);

export const runDataRequest = z.strictObject({
	points: z
		.array(point)
		.min(1, 'Send at least one point.')
		.max(100_000, 'Send at most 100,000 points at a time.')
		.describe('In rising time order; a point out of order is refused with its index'),
	onConflict: z
		.enum(CONFLICT_RULES)
		.default('refuse')
		.describe(
			'A point already stored at that time with the same value is left as it is. With another value: refuse (409, nothing stored) or replace'
		)
});

export const runDataResponse = describes<StoreOutcome>()(
	z.object({
		uploadId: z.string(),
		inserted: z.number(),
		unchanged: z.number().describe('points resent with the value already stored'),
		replaced: z.number(),
		signals: z.array(z.enum(RUN_SIGNAL_NAMES as [RunSignal, ...RunSignal[]]))
	})
);

export const runDataQuery = z.object({
	format: z.enum(['json', 'csv']).default('json').describe('csv: every point, one row per time'),
	page: z.coerce.number().int().min(1).default(1),
	limit: z.coerce.number().int().min(1).max(500).default(50)
});

const signalName = z.enum(RUN_SIGNAL_NAMES as [RunSignal, ...RunSignal[]]);

export const runDataPageResponse = describes<DataPage & { page: number; limit: number }>()(
	z.object({
		total: z.int().describe('times with data in all, over all pages'),
		signals: z.array(signalName).describe('the signals the run has data for'),
		rows: z.array(
			z.object({
				timeS: z.number().describe('seconds since the run started'),
				values: z.partialRecord(signalName, z.number()).describe('each signal read at that time')
			})
		),
		page: z.int(),
		limit: z.int()
	})
);

const hoursSeries = z.object({ timeH: z.array(z.number()), value: z.array(z.number()) });

const learnedValue = <T extends z.ZodType>(value: T) =>
	z.object({ value: value.nullable(), basis: z.string().describe('how it was found, or why not') });

export const runAnalysisResponse = describes<Omit<RunAnalysis, 'report'>>()(
	z.object({
		reportError: z.string().nullable().describe("why the study's plan could not be computed"),
		airSaturationMgPerL: z.number(),
		plan: z
			.object({
				timeH: z.array(z.number()),
				biomassGPerL: z.array(z.number()),
				substrateGPerL: z.array(z.number()),
				dissolvedOxygenPercent: z.array(z.number()),
				ourMmolPerLH: z.array(z.number()),
				volumeL: z.array(z.number()),
				maxOtrMmolPerLH: z.number().nullable(),
				oxygenLimitedFromH: z.number().nullable(),
				targetBiomassGPerL: z.number()
			})
			.nullable()
			.describe("the study's planned time course"),
		chart: z
			.partialRecord(signalName, hoursSeries)
			.describe("the run's signals in hours, thinned for charts"),
		gas: z
			.object({
				timeH: z.array(z.number()),
				ourMmolPerLH: z.array(z.number()),
				cerMmolPerLH: z.array(z.number()),
				respiratoryQuotient: z.array(z.number().nullable()),
				inSituKLaPerH: z.array(z.number().nullable()),
				o2ConsumedMol: z.number(),
				co2ProducedMol: z.number(),
				latest: z
					.object({
						timeH: z.number(),
						our: z.number(),
						cer: z.number(),
						rq: z.number().nullable(),
						kLa: z.number().nullable()
					})
					.nullable(),
				skipped: z.array(z.object({ timeH: z.number(), reason: z.string() })),
				skippedCount: z.int()
			})
			.nullable()
			.describe('OUR, CER, RQ and in situ kLa from the off-gas; null without off-gas data'),
		comparison: z
			.object({
				flags: z.array(
					z.object({
						kind: z.enum(['growthAhead', 'growthBehind', 'oxygenEarly', 'substrateEarly']),
						atH: z.number(),
						message: z.string()
					})
				),
				latestGrowthRatio: z.number().nullable(),
				projection: z
					.object({
						muPerH: z.number(),
						basis: z.string(),
						fromH: z.number(),
						targetAtH: z.number().nullable(),
						oxygenLimitAtH: z.number().nullable()
					})
					.nullable()
			})
			.nullable(),
		learned: z
			.object({
				muMaxPerH: learnedValue(
					z.object({
						value: z.number(),
						standardError: z.number(),
						lower95: z.number().nullable(),
						upper95: z.number().nullable()
					})
				),
				yieldXSGPerG: learnedValue(z.number()),
				yieldXO2GPerG: learnedValue(z.number())
			})
			.nullable()
			.describe('growth values read back from the run'),
		profileValues: z.object({
			muMaxPerH: z.number().nullable(),
			yieldXSGPerG: z.number().nullable(),
			yieldXO2GPerG: z.number().nullable()
		}),
		lastDataH: z.number().nullable()
	})
);

const RUN_CSV = 'The run’s data as a CSV file in the upload’s own columns, one row per time';
const UPLOAD_CSV = `A CSV file: one time column (${Object.keys(TIME_COLUMNS).join(', ')}) and a column per signal (${RUN_SIGNAL_NAMES.join(', ')}); ?onConflict=replace replaces other values at stored times`;

export const runsOperations: ApiOperation[] = [
	{
		method: 'get',
		path: '/api/v1/runs',
		summary:
			'Lists runs with their plan, vessel and organism, searched and sorted, a page at a time (keyset: pass `next` back as `after`)',
		act: 'run.view',
		query: runListQuery,
		response: runListResponse
	},
	{
		method: 'get',
		path: '/api/v1/runs/{id}/data',
		summary:
			"A page of a run's data, one row per time with every signal read then; with format=csv, all of it as a CSV file in the upload's own columns",
		act: 'run.view',
		query: runDataQuery,
		response: runDataPageResponse,
		responseDescription: 'A page of rows (JSON), or every row as CSV with format=csv',
		textBodies: { response: { 'text/csv': RUN_CSV } }
	},
	{
		method: 'post',
		path: '/api/v1/runs/{id}/data',
		summary:
			'Adds data to a run: JSON points, or a CSV file sent as text/csv (the upload columns). The whole request is checked first and nothing is stored unless all of it is valid; resent points with the same value are left as they are; another value at a stored time is refused (409) unless onConflict is replace (JSON) or ?onConflict=replace (CSV)',
		act: 'run.record',
		request: runDataRequest,
		response: runDataResponse,
		textBodies: { request: { 'text/csv': UPLOAD_CSV } },
		successStatus: 201,
		errors: [404, 409, 422]
	},
	{
		method: 'get',
		path: '/api/v1/runs/{id}/analysis',
		summary:
			"The run against its plan, recomputed from the stored data: the plan's time course, the run's signals thinned for charts, OUR, CER, RQ and in situ kLa from off-gas, flags where the run parts from the plan, the projection to the target and the oxygen limit, and growth values fitted to the run",
		act: 'run.view',
		response: runAnalysisResponse,
		responseDescription: 'The analysis the run page draws'
	}
];
