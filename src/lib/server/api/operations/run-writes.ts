import { z } from 'zod';
import { BATCH_STATES } from '$lib/batches';
import { RUN_BATCH_ROLES, RUN_STATES } from '$lib/runs/states';
import type { loadRunPage } from '../../runs/run-page';
import type { ApiOperation } from '../openapi';
import { describes, isoTime } from '../shapes';

// The shapes only: every value is read by the run pages' own schemas (runs/run-store.ts), which
// answer in the pages' words at the same paths.
const typed = z.union([z.number(), z.string(), z.null()]);
const text = z.string().nullable();

export const runCreateRequest = z.strictObject({
	name: text.optional(),
	studyId: text.optional().describe('The study this run follows'),
	vesselId: text.optional().describe('The study’s vessel when left out or empty'),
	profileId: text.optional().describe('The study’s organism profile when left out or empty'),
	startedAt: text
		.optional()
		.describe('Start, YYYY-MM-DDTHH:MM in the site’s time zone, as the form takes it'),
	gasReferenceTemperatureC: typed
		.optional()
		.describe('°C the gas flows are stated at; 0 when left out'),
	gasReferencePressureKPa: typed
		.optional()
		.describe('kPa the gas flows are stated at; 101.325 when left out'),
	people: text.optional().describe('Who ran it'),
	notes: text.optional()
});

export const runReopenRequest = z.strictObject({
	reason: z.string().optional().describe('Why the run is opened again')
});

export const runBatchLinkRequest = z.strictObject({
	batchNumber: text
		.optional()
		.describe('The batch number as typed, or its sheet’s code as scanned'),
	role: text.optional().describe(RUN_BATCH_ROLES.join(' or '))
});

export const runResponse = describes<ReturnType<typeof loadRunPage>>()(
	z.object({
		run: z.object({
			id: z.string(),
			number: z.string(),
			name: z.string(),
			studyId: z.string(),
			vesselId: z.string(),
			profileId: z.string(),
			startedAt: isoTime(),
			endedAt: isoTime().nullable(),
			state: z.enum(RUN_STATES),
			gasReferenceTemperatureC: z.number(),
			gasReferencePressureKPa: z.number(),
			people: z.string(),
			notes: z.string(),
			createdById: z.string(),
			revision: z.int().describe('also the ETag'),
			createdAt: isoTime()
		}),
		studyName: z.string(),
		vesselName: z.string(),
		profileName: z.string(),
		profileRevision: z.int(),
		createdByName: z.string(),
		batches: z.array(
			z.object({
				batchId: z.string(),
				number: z.string(),
				state: z.enum(BATCH_STATES),
				recipeName: z.string(),
				role: z.enum(RUN_BATCH_ROLES),
				addedAt: isoTime(),
				lots: z.array(z.object({ id: z.string(), code: z.string() }))
			})
		),
		uploads: z
			.array(
				z.object({
					id: z.string(),
					source: z.enum(['csv', 'api']),
					fileName: z.string().nullable(),
					rowCount: z.int(),
					pointCount: z.int(),
					unchangedCount: z.int(),
					replacedCount: z.int(),
					createdAt: isoTime(),
					byName: z.string()
				})
			)
			.describe('the latest 20')
	})
);

const ifMatch =
	'If-Match: the ETag GET /api/v1/runs/{id} answered (412 when the run has changed since, 428 without)';

export const runWriteOperations: ApiOperation[] = [
	{
		method: 'post',
		path: '/api/v1/runs',
		summary:
			'Starts a run as the new-run page does: the study it follows, the vessel and organism (the study’s unless others are given), start, people and the gas flows’ reference conditions. Answers the run with its number, Location and ETag',
		act: 'run.record',
		request: runCreateRequest,
		response: runResponse,
		successStatus: 201
	},
	{
		method: 'get',
		path: '/api/v1/runs/{id}',
		summary:
			'One run with its plan, vessel and organism, the batches it used and their lots, and its latest uploads; its ETag is the revision close and reopen name',
		act: 'run.view',
		response: runResponse
	},
	{
		method: 'post',
		path: '/api/v1/runs/{id}/close',
		summary: `Ends an open run, as its page does. ${ifMatch}`,
		act: 'run.record',
		noBody: true,
		response: runResponse,
		errors: [409, 412, 428]
	},
	{
		method: 'post',
		path: '/api/v1/runs/{id}/reopen',
		summary: `Opens an ended run again with the reason, as its page does. ${ifMatch}`,
		act: 'run.record',
		request: runReopenRequest,
		response: runResponse,
		errors: [409, 412, 428]
	},
	{
		method: 'post',
		path: '/api/v1/runs/{id}/batches',
		summary:
			'Links a released batch to the run by its number or its sheet’s code, as medium or feed, as the run page does; its lots are then traceable to the run. Answers the run',
		act: 'run.record',
		request: runBatchLinkRequest,
		response: runResponse,
		successStatus: 201,
		errors: [409]
	}
];
