import { z } from 'zod';
import { BATCH_STATES } from '$lib/batches';
import type { ApiOperation } from '../openapi';

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Write the date as YYYY-MM-DD');

export const batchListQuery = z.object({
	state: z.enum(BATCH_STATES).optional(),
	recipe: z.string().max(80).optional().describe('Recipe id'),
	from: isoDate.optional().describe('Planned on or after'),
	to: isoDate.optional().describe('Planned on or before')
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

export const batchesOperations: ApiOperation[] = [
	{
		method: 'get',
		path: '/api/v1/batches',
		summary: 'Batches. Query: state, recipe, from, to (planned date)',
		act: 'batch.view'
	},
	{
		method: 'post',
		path: '/api/v1/batches',
		summary:
			'Plans a batch from an approved recipe version and a volume; the number follows the site pattern',
		act: 'batch.plan',
		request: batchCreateRequest,
		successStatus: 201,
		errors: [404, 409]
	},
	{
		method: 'get',
		path: '/api/v1/batches/{id}',
		summary:
			'One batch record: lines with required and actual quantities (µg for masses, µL for stock volumes), lots, deviations, signatures',
		act: 'batch.view'
	}
];
