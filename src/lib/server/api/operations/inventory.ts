import { z } from 'zod';
import { DATE_KINDS, LOT_STATUSES, QUANTITY_UNITS } from '$lib/inventory';
import type { ApiOperation } from '../openapi';

export const lotListQuery = z.object({
	component: z.string().max(80).optional().describe('Component id'),
	status: z.enum(LOT_STATUSES).optional(),
	expiringBefore: z
		.string()
		.regex(/^\d{4}-\d{2}-\d{2}$/, 'Write the date as YYYY-MM-DD')
		.optional()
		.describe('Lots whose expiry or retest date is on or before this date'),
	q: z.string().max(120).optional()
});

const text = (max: number) => z.union([z.string().max(max), z.number()]);

export const lotCreateRequest = z.object({
	component: z.string().min(1).max(120).describe('Component id or name'),
	supplier: z.string().max(120),
	supplierLot: z.string().max(80),
	quantity: text(30).describe('Amount received'),
	unit: z
		.string()
		.max(10)
		.describe(`One of ${QUANTITY_UNITS.join(', ')}`),
	receivedOn: z.string().max(10).describe('YYYY-MM-DD'),
	expiresOn: z.string().max(10).describe('YYYY-MM-DD, after receivedOn'),
	dateKind: z.enum(DATE_KINDS).optional(),
	storage: z.string().max(200).optional(),
	assayPercent: text(20).optional(),
	purityPercent: text(20).optional(),
	waterContentPercent: text(20).optional(),
	note: z.string().max(1000).optional()
});

export const inventoryOperations: ApiOperation[] = [
	{
		method: 'get',
		path: '/api/v1/lots',
		summary:
			'Lots with on-hand (sum of the ledger, base unit mg or µL). Query: component, status, expiringBefore (YYYY-MM-DD), q',
		act: 'lot.view'
	},
	{
		method: 'post',
		path: '/api/v1/lots',
		summary:
			'Receives a lot into quarantine with its receipt ledger entry. Field problems come back as errors at their field',
		act: 'lot.receive',
		request: lotCreateRequest,
		successStatus: 201,
		errors: [404, 409]
	},
	{
		method: 'get',
		path: '/api/v1/lots/{id}',
		summary: 'One lot with its ledger, certificates and where-used (batches that used it)',
		act: 'lot.view'
	}
];
