import { z } from 'zod';
import {
	PRECIPITATION_RULES,
	TARGET_BASES,
	type FeedDesign,
	type StudyReport,
	sufficiencyLineResponse
} from '$chemistry';
import { VERSION_STATUSES } from '$lib/recipes';
import type { SavedFeedDraft } from '../../studies/feed-drafts';
import { STUDY_SORTS, type StudyListRow } from '../../studies/study-list';
import { keysetFields, keysetPageSchema, type KeysetPage } from '../../keyset';
import { pagingFields } from '../../list-paging';
import type { ApiOperation } from '../openapi';
import { describes, documentsPartOf, isoTime } from '../shapes';

const finite = z.number({ error: 'Give a number.' });

// Strict at every level: a misspelt key is a 400 naming it, never silently ignored.
export const evaluateRequest = z.strictObject({
	studyId: z.string().min(1).max(80),
	whatIf: z
		.strictObject({
			targetValue: finite.optional().describe('g/L dry biomass or cells/mL, as the study'),
			feedVolumeL: finite
				.optional()
				.describe(
					'Total feed volume: planned for open plans, available for substrate- and DO-stat plans; every feed is scaled in proportion'
				),
			kLaPerH: finite.optional(),
			o2MoleFraction: finite.optional().describe('O2 mole fraction of the inlet gas, 0–1'),
			temperatureC: finite.optional()
		})
		.default({})
});

/** The report's verdict and nutrient part; oxygen, heat, volume, feeds and the time course are not described here. */
export const evaluateResponse = documentsPartOf<StudyReport>()(
	z
		.object({
			verdict: z.enum(['supported', 'not supported']),
			reasons: z
				.array(z.string())
				.describe(
					'Why not, one sentence each: required nutrients short of the safety factor, oxygen, heat, volume, feeds'
				),
			warnings: z
				.array(z.string())
				.describe(
					'What holds but needs watching: trace elements short of the safety factor (each by name; they never set the limit), nutrients a feed covers only later, a profile whose fractions contradict its formula'
				),
			limit: z
				.object({
					key: z.string(),
					name: z.string(),
					basis: z.enum(['element', 'component']),
					ratio: z.number(),
					maxBiomassGPerL: z.number().nullable(),
					maxCellsPerMl: z.number().nullable()
				})
				.describe('The limiting required nutrient and the maximum supportable density'),
			nutrients: z.object({
				check: z.enum(['ok', 'short']).describe("'short' when a required nutrient is"),
				lines: z.array(
					sufficiencyLineResponse.extend({
						name: z.string(),
						runout: z
							.object({ shortFromH: z.number(), coveredAgainH: z.number().nullable() })
							.nullable(),
						noRunout: z
							.enum(['modelled', 'lasts', 'no time course'])
							.nullable()
							.describe(
								'Why runout is null: the carbon source is modelled in the time course, the nutrient lasts the run, or there is no time course'
							)
					})
				),
				notes: z.array(z.string())
			})
		})
		.loose()
);

export const feedDesignRequest = z.strictObject({
	componentIds: z
		.array(z.string().min(1, 'Choose a component.').max(80))
		.min(1, 'Choose at least one component.')
		.max(40, 'At most 40 components.'),
	feedVolumeL: finite.describe('All proposed feeds together, L'),
	temperatureC: finite.min(0, 'At least 0 °C').max(60, 'At most 60 °C'),
	osmolalityMaxMOsmPerKg: finite
		.gt(0, 'Above 0 mOsm/kg')
		.max(10000, 'At most 10 000 mOsm/kg')
		.optional()
		.describe(
			"Highest osmolality of each feed (the recipe analysis's estimate); the organism group's default when omitted"
		),
	dissolvedSolidsMaxGPerL: finite
		.gt(0, 'Above 0 g/L')
		.max(2000, 'At most 2 000 g/L')
		.optional()
		.describe("Highest Σ g/L of each feed; the organism group's default when omitted")
});

export const feedDesignDraftsRequest = feedDesignRequest.extend({
	names: z
		.array(
			z
				.string()
				.trim()
				.min(1, 'Give the draft a name.')
				.max(120, 'Keep the name to 120 characters.')
		)
		.min(1, 'Give each proposed feed a name.')
		.max(2, 'A proposal has at most two feeds.')
		.describe('One recipe name per proposed feed, in the order of the proposal')
});

const versionRef = z.object({
	id: z.string(),
	recipeId: z.string(),
	recipeName: z.string(),
	recipeKind: z.string(),
	n: z.int(),
	status: z.enum(VERSION_STATUSES),
	superseded: z
		.boolean()
		.describe('a later version of the same recipe is approved, or this one is retired'),
	supersededBy: z.int().nullable()
});

const STUDY_LIST_ORDER = { sort: 'updatedAt', dir: 'desc' } as const;

const studyFilterFields = {
	q: z.string().max(120).optional().describe('Part of the study, organism or vessel name')
};

/** The API's study list: the search, a page at a time by cursor. */
export const studyListQuery = z.object({
	...studyFilterFields,
	...keysetFields(STUDY_SORTS, STUDY_LIST_ORDER)
});

/** The studies page: the same search, paged by number. */
export const studyPageQuery = z.object({
	...studyFilterFields,
	...pagingFields(STUDY_SORTS, STUDY_LIST_ORDER)
});

export const studyListResponse = describes<KeysetPage<StudyListRow>>()(
	keysetPageSchema(
		z.object({
			id: z.string(),
			name: z.string(),
			targetBasis: z.enum(TARGET_BASES),
			targetValue: z.number().describe('g/L dry biomass or cells/mL, as targetBasis'),
			basalVersionId: z.string(),
			profileName: z.string(),
			vesselName: z.string(),
			createdByName: z.string(),
			updatedAt: isoTime(),
			basal: versionRef,
			feeds: z.array(versionRef.extend({ volumeL: z.number() }))
		}),
		'study'
	)
);

export const feedDesignResponse = describes<FeedDesign>()(
	z.object({
		feasible: z.boolean(),
		feedVolumeL: z.number(),
		maxFeedVolumeL: z.number().describe('room left in the vessel for feed'),
		temperatureC: z.number(),
		osmolalityMaxMOsmPerKg: z.number(),
		dissolvedSolidsMaxGPerL: z.number(),
		feeds: z.array(
			z.object({
				key: z.enum(['single', 'cations', 'anions']),
				label: z.string(),
				description: z.string(),
				volumeL: z.number(),
				lines: z.array(
					z.object({
						componentId: z.string(),
						name: z.string(),
						gPerL: z.number(),
						massG: z.number(),
						solubilityGPerL: z.number().nullable(),
						atSolubilityLimit: z.boolean()
					})
				),
				osmolalityMOsmPerKg: z.number(),
				dissolvedSolidsGPerL: z.number(),
				warnings: z.array(
					z.object({
						kind: z.enum(['solubility', 'precipitation']),
						basis: z.enum(['published value', 'common practice']),
						message: z.string(),
						precipitate: z.enum(PRECIPITATION_RULES.map((rule) => rule.product)).optional()
					})
				)
			})
		),
		split: z
			.object({ precipitates: z.array(z.string()), warnings: z.array(z.string()) })
			.nullable()
			.describe('why one feed would not do'),
		coverage: z.array(
			z.object({
				key: z.string(),
				name: z.string(),
				neededG: z.number(),
				providedG: z.number(),
				coveredByBasal: z.boolean()
			})
		),
		problems: z.array(z.string()).describe('why it cannot be done; empty when feasible'),
		notes: z.array(z.string()),
		minimumFeedVolumeL: z.number().nullable(),
		limitsSource: z.string().nullable().describe('where the default limits come from')
	})
);

export const feedDraftsResponse = describes<{ drafts: SavedFeedDraft[] }>()(
	z.object({
		drafts: z.array(z.object({ recipeId: z.string(), name: z.string(), editUrl: z.string() }))
	})
);

export const studiesOperations: ApiOperation[] = [
	{
		method: 'get',
		path: '/api/v1/studies',
		summary:
			'Lists saved studies with the recipe versions they use and whether any is superseded, searched and sorted, a page at a time (keyset: pass `next` back as `after`)',
		act: 'study.use',
		query: studyListQuery,
		response: studyListResponse
	},
	{
		method: 'post',
		path: '/api/v1/studies/evaluate',
		summary:
			'Evaluates a saved study with what-if changes (target, feed volume, kLa, O2 fraction, temperature): verdict, limit (required nutrients only), per-nutrient table with the role, confidence and source of each line, warnings (short trace elements by name), oxygen, heat, volume, time course, defaults used',
		act: 'study.use',
		request: evaluateRequest,
		response: evaluateResponse,
		errors: [404, 422, 503]
	},
	{
		method: 'post',
		path: '/api/v1/studies/{id}/feed-design',
		summary:
			"Proposes a feed concentrate (g/L per component) that covers every nutrient at the study's target and safety factor within solubility and vessel volume, or says why it cannot",
		act: 'study.use',
		request: feedDesignRequest,
		response: feedDesignResponse,
		errors: [422]
	},
	{
		method: 'post',
		path: '/api/v1/studies/{id}/feed-design/drafts',
		summary:
			"Designs the feed(s) again from the same request and saves each proposed feed as a new feed recipe whose version 1 draft holds its lines, with the recipe editor's checks and audit; answers the drafts and their editor links",
		act: 'study.save-feed-drafts',
		request: feedDesignDraftsRequest,
		response: feedDraftsResponse,
		successStatus: 201,
		errors: [422]
	}
];
