import { PICTOGRAM_IDS, type PictogramId } from '$chemistry';
import { z } from 'zod';
import { BATCH_LINE_KINDS, BATCH_STATES, DEVIATION_KINDS } from '$lib/batches';
import { QUANTITY_KINDS } from '$lib/inventory';
import { RECIPE_KINDS } from '$lib/recipes';
import type { Batch } from '../../db/schema';
import type { batchView } from '../../batches/view';
import { BATCH_SORTS, type BatchFilter, type BatchListRow } from '../../batches/batch-list';
import { keysetFields, keysetPageSchema, type KeysetPage } from '../../keyset';
import { pagingFields } from '../../list-paging';
import type { ApiOperation } from '../openapi';
import { describes, isoTime, signatureResponse } from '../shapes';

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Write the date as YYYY-MM-DD');

const BATCH_LIST_ORDER = { sort: 'plannedOn', dir: 'desc' } as const;

const batchFilterFields = {
	state: z
		.enum(BATCH_STATES)
		.optional()
		.describe(`Only batches in this state (${BATCH_STATES.join(', ')})`),
	recipe: z.string().max(80).optional().describe('Recipe id'),
	from: isoDate.optional().describe('Planned on or after'),
	to: isoDate.optional().describe('Planned on or before'),
	q: z
		.string()
		.max(120)
		.optional()
		.describe('Part of the batch number, the recipe name or what the batch is for')
};

/** The batch filter the list's query asks for, the API's and the page's alike. */
export function batchFilterOf(query: z.infer<z.ZodObject<typeof batchFilterFields>>): BatchFilter {
	return {
		state: query.state,
		recipeId: query.recipe,
		from: query.from,
		to: query.to,
		search: query.q
	};
}

/** The API's batch list: the filter, a page at a time by cursor (ties by batch number). */
export const batchListQuery = z.object({
	...batchFilterFields,
	...keysetFields(BATCH_SORTS, BATCH_LIST_ORDER)
});

/** The batches page: the same filter, paged by number. */
export const batchPageQuery = z.object({
	...batchFilterFields,
	...pagingFields(BATCH_SORTS, BATCH_LIST_ORDER)
});

export const batchCreateRequest = z
	.object({
		recipeId: z
			.string()
			.max(80)
			.optional()
			.describe('The recipe; its current approved version is used'),
		versionId: z.string().max(80).optional().describe('A specific approved version'),
		targetVolumeL: z.union([z.number(), z.string().max(20)]).describe('Litres'),
		plannedOn: z.string().max(10).describe('YYYY-MM-DD'),
		intendedUse: z.string().max(200).describe('The vessel or run')
	})
	.refine((b) => b.recipeId || b.versionId, {
		message: 'Give recipeId or versionId',
		path: ['recipeId']
	});

const batchRow = {
	id: z.string(),
	number: z.string().describe('the site numbering pattern'),
	numberYear: z.int(),
	numberSeq: z.int(),
	recipeId: z.string(),
	versionId: z.string(),
	targetVolumeMl: z.int(),
	plannedOn: z.string().describe('YYYY-MM-DD'),
	intendedUse: z.string(),
	state: z.enum(BATCH_STATES),
	createdById: z.string(),
	preparedById: z.string().nullable(),
	startedAt: isoTime().nullable(),
	preparedAt: isoTime().nullable(),
	measuredPh: z.number().nullable(),
	measuredOsmolality: z.number().nullable().describe('mOsm/kg'),
	reviewedById: z.string().nullable(),
	reviewedAt: isoTime().nullable(),
	reviewNote: z.string(),
	createdAt: isoTime()
};

export const batchResponse = describes<Batch>()(z.object(batchRow));

export const batchListResponse = describes<KeysetPage<BatchListRow>>()(
	keysetPageSchema(
		z.object({
			id: z.string(),
			number: z.string(),
			state: z.enum(BATCH_STATES),
			recipeId: z.string(),
			recipeName: z.string(),
			versionN: z.int(),
			targetVolumeMl: z.int(),
			plannedOn: z.string().describe('YYYY-MM-DD'),
			intendedUse: z.string(),
			preparedAt: isoTime().nullable()
		}),
		'batch'
	)
);

const lotChoice = z.object({
	id: z.string(),
	code: z.string(),
	expiresOn: z.string(),
	dateKind: z.string(),
	status: z.string(),
	expired: z.boolean(),
	assayPercent: z.number().nullable(),
	waterContentPercent: z.number().nullable(),
	onHand: z.number().describe("in the lot's base unit: mg by mass, µL by volume"),
	quantityKind: z.enum(QUANTITY_KINDS),
	supplier: z.string(),
	supplierLot: z.string()
});

const hazardSet = z
	.object({
		statements: z.array(z.object({ code: z.string(), text: z.string() })),
		pictograms: z.array(z.enum(PICTOGRAM_IDS as [PictogramId, ...PictogramId[]])),
		signalWord: z.enum(['Danger', 'Warning']).nullable(),
		ppe: z.array(z.object({ id: z.string(), text: z.string() }))
	})
	.describe(
		'GHS statements (UN GHS), their pictograms and signal word, and the protective equipment they call for'
	);

const preparationResponse = z
	.object({
		lines: z
			.record(z.string(), hazardSet)
			.describe('per line id: the component as weighed, or the stock solution at its own strength'),
		ph: z
			.object({
				agents: z.array(
					z.object({ name: z.string(), workingSolution: z.string(), hazards: hazardSet })
				),
				unnamed: z.string().nullable()
			})
			.nullable(),
		finished: hazardSet.describe('the finished solution at its concentrations'),
		ppe: z.array(z.object({ id: z.string(), text: z.string() })),
		fumeHood: z.array(z.string()).describe('lines whose handling calls for the fume hood'),
		notices: z
			.array(z.object({ id: z.string(), text: z.string() }))
			.describe('our own notices in plain words, not GHS statements')
	})
	.describe('what is handled at each step of the preparation, and its hazards there');

export const batchViewResponse = describes<ReturnType<typeof batchView>>()(
	z.object({
		batch: z.object({
			...batchRow,
			createdByName: z.string().nullable(),
			preparedByName: z.string().nullable(),
			reviewedByName: z.string().nullable()
		}),
		recipe: z.object({ id: z.string(), name: z.string(), kind: z.enum(RECIPE_KINDS) }),
		version: z.object({
			id: z.string(),
			n: z.int(),
			targetPh: z.number().nullable(),
			phRange: z.object({ min: z.number(), max: z.number() }).nullable(),
			osmolalityMinMOsmPerKg: z.number().nullable(),
			osmolalityMaxMOsmPerKg: z.number().nullable(),
			preparationTemperatureC: z.number(),
			instructions: z.string(),
			storage: z.string(),
			shelfLifeDays: z.int().nullable()
		}),
		lines: z.array(
			z.object({
				id: z.string(),
				position: z.int(),
				kind: z.enum(BATCH_LINE_KINDS),
				name: z.string(),
				basisName: z.string().nullable(),
				componentId: z.string().nullable(),
				stockRecipeId: z.string().nullable(),
				formula: z.string().nullable(),
				amount: z.number(),
				unit: z.string(),
				note: z.string(),
				tolerancePercent: z.number(),
				quantityUnit: z.enum(['µg', 'µL']),
				requiredQuantity: z.number().describe('in quantityUnit'),
				requiredFor: z.enum(['chosen', 'suggested', 'nominal']),
				requiredText: z.string(),
				steps: z.array(z.string()),
				chosen: lotChoice.nullable(),
				suggestion: lotChoice.nullable(),
				suggestionNote: z.string().nullable(),
				actualQuantity: z.number().nullable().describe('in quantityUnit'),
				actualText: z.string().nullable(),
				doneAt: isoTime().nullable(),
				doneById: z.string().nullable(),
				doneByName: z.string().nullable(),
				stockSource: z.string(),
				consumedText: z.string().nullable(),
				verdict: z.enum(['within', 'below', 'above']).nullable()
			})
		),
		lots: z.array(
			z.object({
				position: z.int(),
				lotId: z.string(),
				lotCode: z.string(),
				componentName: z.string(),
				supplier: z.string(),
				supplierLot: z.string(),
				expiresOn: z.string(),
				lotStatus: z.string(),
				consumedQuantity: z.number().nullable(),
				quantityKind: z.enum(QUANTITY_KINDS)
			})
		),
		deviations: z.array(
			z.object({
				id: z.string(),
				lineId: z.string().nullable(),
				kind: z.enum(DEVIATION_KINDS),
				detail: z.string(),
				reason: z.string(),
				at: isoTime(),
				by: z.string()
			})
		),
		signatures: z.array(signatureResponse),
		preparation: preparationResponse,
		completionProblem: z
			.string()
			.nullable()
			.describe('why the batch cannot be completed yet; null once it can, or is'),
		recordUrl: z.string()
	})
);

export const batchesOperations: ApiOperation[] = [
	{
		method: 'get',
		path: '/api/v1/batches',
		summary:
			'Batches, filtered, searched and sorted, a page at a time (keyset: pass `next` back as `after`)',
		act: 'batch.view',
		query: batchListQuery,
		response: batchListResponse
	},
	{
		method: 'post',
		path: '/api/v1/batches',
		summary:
			'Plans a batch from an approved recipe version and a volume; the number follows the site pattern',
		act: 'batch.plan',
		request: batchCreateRequest,
		response: batchResponse,
		successStatus: 201,
		errors: [404, 409]
	},
	{
		method: 'get',
		path: '/api/v1/batches/{id}',
		summary:
			'One batch record: lines with required and actual quantities (µg for masses, µL for stock volumes), lots, deviations, signatures',
		act: 'batch.view',
		response: batchViewResponse
	}
];
