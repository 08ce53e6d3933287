import { z } from 'zod';
import { BATCH_STATES } from '$lib/batches';
import {
	DATE_KINDS,
	LEDGER_KINDS,
	LOT_STATUSES,
	QUANTITY_KINDS,
	QUANTITY_UNITS
} from '$lib/inventory';
import type { Lot } from '../../db/schema';
import { LOT_SORTS, type LotFilter, type LotRow } from '../../inventory/lot-list';
import { ledgerPageQuery, type LedgerPage } from '../../inventory/ledger-page';
import { keysetFields, keysetPageSchema, type KeysetPage } from '../../keyset';
import { DEFAULT_PAGE_SIZE, pagingFields } from '../../list-paging';
import type { lotView } from '../../inventory/view';
import type { ApiOperation } from '../openapi';
import { describes, isoTime } from '../shapes';

const LOT_LIST_ORDER = { sort: 'expiresOn', dir: 'asc' } as const;

const lotFilterFields = {
	component: z.string().max(80).optional().describe('Component id'),
	status: z
		.enum(LOT_STATUSES)
		.optional()
		.describe(`Only lots in this status (${LOT_STATUSES.join(', ')})`),
	expiringBefore: z
		.string()
		.regex(/^\d{4}-\d{2}-\d{2}$/, 'Write the date as YYYY-MM-DD')
		.optional()
		.describe('Lots whose expiry or retest date is on or before this date'),
	q: z
		.string()
		.max(120)
		.optional()
		.describe('Part of the lot code, supplier, supplier lot or component')
};

/** The lot filter the list's query asks for, the API's and the page's alike. */
export function lotFilterOf(query: z.infer<z.ZodObject<typeof lotFilterFields>>): LotFilter {
	return {
		componentId: query.component,
		status: query.status,
		expiringBefore: query.expiringBefore,
		search: query.q
	};
}

/** The API's lot list: the filter, a page at a time by cursor. */
export const lotListQuery = z.object({
	...lotFilterFields,
	...keysetFields(LOT_SORTS, LOT_LIST_ORDER)
});

/** The lots page: the same filter, paged by number. */
export const lotPageQuery = z.object({
	...lotFilterFields,
	...pagingFields(LOT_SORTS, LOT_LIST_ORDER)
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

const isoDay = z.string().describe('YYYY-MM-DD');
const baseQuantity = (what: string) =>
	z.number().describe(`${what}, in the lot's base unit: mg by mass, µL by volume (quantityKind)`);

export const lotListResponse = describes<KeysetPage<LotRow>>()(
	keysetPageSchema(
		z.object({
			id: z.string(),
			code: z.string(),
			componentId: z.string().nullable().describe('null for a stock solution made here'),
			componentName: z.string(),
			supplier: z.string(),
			supplierLot: z.string(),
			quantityKind: z.enum(QUANTITY_KINDS),
			receivedQuantity: baseQuantity('As received'),
			onHand: baseQuantity('The sum of the ledger'),
			receivedOn: isoDay,
			expiresOn: isoDay,
			retestOn: isoDay.nullable().describe('retest due from this date; null: none due'),
			dateKind: z.string(),
			storage: z.string(),
			status: z.enum(LOT_STATUSES),
			expired: z.boolean(),
			assayPercent: z.number().nullable(),
			purityPercent: z.number().nullable(),
			waterContentPercent: z.number().nullable()
		}),
		'lot'
	)
);

const lotRow = {
	id: z.string(),
	code: z.string().describe('the internal lot id on the label'),
	componentId: z.string().nullable().describe('null for a stock solution made here'),
	sourceBatchId: z
		.string()
		.nullable()
		.describe('the stock-solution batch this lot is; null for a received lot'),
	retestOn: isoDay
		.nullable()
		.describe(
			'from this date the lot must be retested before use (set by a recall); null: none due'
		),
	supplier: z.string(),
	supplierLot: z.string(),
	quantityKind: z.enum(QUANTITY_KINDS),
	receivedQuantity: baseQuantity('As received'),
	receivedUnit: z.string().describe('the unit it was written in'),
	receivedOn: isoDay,
	expiresOn: isoDay.describe('expiry or retest date, as dateKind says'),
	dateKind: z.enum(DATE_KINDS),
	storage: z.string(),
	assayPercent: z.number().nullable(),
	purityPercent: z.number().nullable(),
	waterContentPercent: z.number().nullable(),
	status: z.enum(LOT_STATUSES),
	statusReason: z.string(),
	statusChangedAt: isoTime().nullable(),
	statusChangedById: z.string().nullable(),
	receivedById: z.string(),
	note: z.string(),
	createdAt: isoTime()
};

export const lotResponse = describes<Lot>()(z.object(lotRow));

const ledgerEntry = z.object({
	id: z.string(),
	at: isoTime(),
	kind: z.enum(LEDGER_KINDS),
	quantity: baseQuantity('Signed: received positive, taken negative'),
	reason: z.string(),
	batchId: z.string().nullable(),
	by: z.string().nullable().describe('e-mail of who recorded it')
});

export const ledgerPageResponse = describes<LedgerPage>()(
	z.object({
		entries: z.array(ledgerEntry).describe('newest first'),
		total: z.int().describe("how many entries the lot's ledger has in all"),
		earlier: z
			.string()
			.nullable()
			.describe('pass as `before` for the page before this one; null on the earliest')
	})
);

export const lotViewResponse = describes<ReturnType<typeof lotView>>()(
	z.object({
		lot: z.object({
			...lotRow,
			expired: z.boolean(),
			receivedByName: z.string().nullable(),
			statusChangedByName: z.string().nullable()
		}),
		component: z
			.object({
				id: z.string().nullable(),
				name: z.string(),
				formula: z.string().nullable(),
				densityGPerMl: z.number().nullable(),
				ghsHazards: z.array(z.object({ code: z.string(), text: z.string() }))
			})
			.describe('what the lot holds; for a stock solution made here, `id` is null'),
		stock: z
			.object({
				recipeId: z.string(),
				recipeName: z.string(),
				batchId: z.string(),
				batchNumber: z.string()
			})
			.nullable()
			.describe('the stock-solution recipe and batch a made-here lot is; null for a received lot'),
		onHand: baseQuantity('The sum of the ledger'),
		ledger: z
			.array(ledgerEntry)
			.describe(
				`the latest ${DEFAULT_PAGE_SIZE} entries, newest first; earlier ones from GET /api/v1/lots/{id}/ledger?before=ledgerEarlier`
			),
		ledgerTotal: z.int().describe('how many entries the ledger has in all'),
		ledgerEarlier: z
			.string()
			.nullable()
			.describe('cursor of the entries before `ledger`; null when it holds them all'),
		certificates: z.array(
			z.object({
				id: z.string(),
				displayName: z.string(),
				mediaType: z.string(),
				sizeBytes: z.int(),
				uploadedAt: isoTime()
			})
		),
		whereUsed: z.array(
			z.object({
				batchId: z.string(),
				batchNumber: z.string(),
				state: z.enum(BATCH_STATES),
				recipeName: z.string(),
				plannedOn: isoDay,
				preparedAt: isoTime().nullable(),
				intendedUse: z.string(),
				position: z.int(),
				consumedQuantity: baseQuantity('Taken from the lot')
					.nullable()
					.describe('null while the batch is not yet prepared'),
				quantityKind: z.enum(QUANTITY_KINDS),
				depth: z.int().describe('1: used the lot itself; 2: used a stock made with it; and so on'),
				viaLotCode: z
					.string()
					.nullable()
					.describe('the stock (its batch number) this use came through; null at depth 1')
			})
		)
	})
);

export const inventoryOperations: ApiOperation[] = [
	{
		method: 'get',
		path: '/api/v1/lots',
		summary:
			'Lots with on-hand (sum of the ledger, base unit mg or µL), filtered, searched and sorted, a page at a time (keyset: pass `next` back as `after`)',
		act: 'lot.view',
		query: lotListQuery,
		response: lotListResponse
	},
	{
		method: 'post',
		path: '/api/v1/lots',
		summary:
			'Receives a lot into quarantine with its receipt ledger entry. Field problems come back as errors at their field',
		act: 'lot.receive',
		request: lotCreateRequest,
		response: lotResponse,
		successStatus: 201,
		errors: [404, 409]
	},
	{
		method: 'get',
		path: '/api/v1/lots/{id}',
		summary:
			'One lot with its latest ledger entries, certificates and where-used (batches that used it)',
		act: 'lot.view',
		response: lotViewResponse
	},
	{
		method: 'get',
		path: '/api/v1/lots/{id}/ledger',
		summary:
			"A lot's stock ledger a page at a time, newest first (keyset: pass `earlier` back as `before`)",
		act: 'lot.view',
		query: ledgerPageQuery,
		response: ledgerPageResponse,
		errors: [404]
	}
];
