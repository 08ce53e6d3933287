import { z } from 'zod';
import { DRAFT_FIELD_LABELS, RECIPE_KINDS, STOCK_DOSE_UNIT } from '$lib/recipes';
import { MAX_LINES } from '$lib/recipes/draft-schema';
import type { SubmitOutcome } from '../../recipes/version-api';
import type { ApiOperation } from '../openapi';
import { describes } from '../shapes';
import { versionResponse } from './recipes';

// The shapes only: each value is read by the editor's own rules (lib/recipes/draft-schema.ts and
// server/recipes/draft.ts), which answer in the editor's words at the same paths.
const typed = z.union([z.number(), z.string(), z.null()]);
const text = z.string().nullable();

const draftFieldsShape = {
	targetPh: typed.optional().describe(`${DRAFT_FIELD_LABELS.targetPh}, 0–14`),
	osmolalityMinMOsmPerKg: typed.optional().describe(DRAFT_FIELD_LABELS.osmolalityMinMOsmPerKg),
	osmolalityMaxMOsmPerKg: typed.optional().describe(DRAFT_FIELD_LABELS.osmolalityMaxMOsmPerKg),
	preparationTemperatureC: typed
		.optional()
		.describe(`${DRAFT_FIELD_LABELS.preparationTemperatureC}; 25 when blank`),
	shelfLifeDays: typed.optional().describe(`${DRAFT_FIELD_LABELS.shelfLifeDays}, whole days`),
	storage: text.optional().describe(DRAFT_FIELD_LABELS.storage),
	instructions: text.optional().describe(DRAFT_FIELD_LABELS.instructions),
	changeNote: text.optional().describe(DRAFT_FIELD_LABELS.changeNote)
};

export const draftLineRequest = z.strictObject({
	kind: z.string().optional().describe('component (the default) or stock'),
	componentId: text
		.optional()
		.describe('A library component by id; an unknown one is refused naming the nearest ones'),
	shelfFormId: text.optional().describe('The form weighed, a hydrate or salt of the component'),
	stockRecipeId: text.optional().describe('A stock line: the stock solution recipe'),
	amount: typed.optional().describe('Concentration in the finished medium; mL per L for a stock'),
	unit: text.optional().describe(`g/L, mg/L, mM, µM, % w/v; ${STOCK_DOSE_UNIT} for a stock`),
	tolerancePercent: typed
		.optional()
		.describe('Weighing tolerance, % above 0 and up to 50; 2 when blank'),
	note: text.optional()
});

const lines = z
	.array(draftLineRequest)
	.describe(`In order, at most ${MAX_LINES}; a problem comes back at lines.<i>.<field>`);

export const recipeCreateRequest = z.strictObject({
	name: z.string().optional(),
	kind: z.string().optional().describe(RECIPE_KINDS.join(', ')),
	...draftFieldsShape,
	lines: lines.optional().describe('The draft’s lines; none when left out')
});

export const versionFieldsRequest = z
	.strictObject(draftFieldsShape)
	.describe('A field left out keeps its value; null or "" empties it, as in the editor');

export const versionLinesRequest = z.strictObject({ lines });

export const newDraftRequest = z.strictObject({
	fromVersion: z
		.int()
		.min(1)
		.optional()
		.describe('The version the draft copies; the latest when left out')
});

export const submitResponse = describes<SubmitOutcome>()(
	z.object({
		n: z.int(),
		status: z.literal('in_review'),
		reviewersMailed: z.int().describe('people told by mail who may review and approve it'),
		message: z.string().describe('what the page says after submitting')
	})
);

const ifMatch =
	'If-Match: the ETag that GET /api/v1/recipes/{id}/versions/{n} answered (412 when the draft has changed since, 428 without)';

export const recipeWriteOperations: ApiOperation[] = [
	{
		method: 'post',
		path: '/api/v1/recipes',
		summary:
			'Creates a recipe with its version 1 draft, as the new-recipe page and the editor do: name and kind, the version’s fields and its lines, checked all at once in the editor’s words. Answers the draft with Location and ETag',
		act: 'recipe.edit',
		request: recipeCreateRequest,
		response: versionResponse,
		successStatus: 201
	},
	{
		method: 'put',
		path: '/api/v1/recipes/{id}/versions/{n}',
		summary: `Saves a draft’s fields (pH, osmolality range, preparation temperature, shelf life, storage, instructions, change note) with its lines as they are, as the editor’s save does. ${ifMatch}`,
		act: 'recipe.edit',
		request: versionFieldsRequest,
		response: versionResponse,
		errors: [409, 412, 428]
	},
	{
		method: 'put',
		path: '/api/v1/recipes/{id}/versions/{n}/lines',
		summary: `Replaces a draft’s lines, as the editor’s save does: the same line rules, the component lookup with its suggestions, the audit entry with each line before and after. ${ifMatch}`,
		act: 'recipe.edit',
		request: versionLinesRequest,
		response: versionResponse,
		errors: [409, 412, 428]
	},
	{
		method: 'post',
		path: '/api/v1/recipes/{id}/versions/{n}/submit',
		summary: `Submits a draft for review, as the version page does; the people who may review it are told by mail. ${ifMatch}`,
		act: 'recipe.edit',
		noBody: true,
		response: submitResponse,
		errors: [409, 412, 428]
	},
	{
		method: 'post',
		path: '/api/v1/recipes/{id}/drafts',
		summary:
			'Starts a new draft copied from a version (the latest unless fromVersion says), as the recipe page’s button; refused while another version is a draft or in review. Answers the draft with Location and ETag',
		act: 'recipe.edit',
		request: newDraftRequest,
		response: versionResponse,
		successStatus: 201,
		errors: [409]
	}
];
