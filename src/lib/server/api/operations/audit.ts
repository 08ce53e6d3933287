import { z } from 'zod';
import { DEFAULT_PAGE_SIZE, MAX_PAGE_SIZE } from '../../list-paging';
import { decodeAuditCursor, type AuditApiPage } from '../../trail/api-page';
import type { ApiOperation } from '../openapi';
import { describes, isoTime } from '../shapes';

const text = z.string().max(200).optional();

/** The trail page's filter, and the cursor and page size of the API. */
export const auditListQuery = z.object({
	type: text.describe('Subject type (lot, batch, recipe, …)'),
	subject: text.describe('One record: <type>:<id>'),
	actor: text.describe('Part of the person’s e-mail or name'),
	action: text.describe('An action code, or its start such as `lot.`'),
	from: text.describe('First day, YYYY-MM-DD (UTC)'),
	to: text.describe('Last day, YYYY-MM-DD (UTC), included'),
	order: z
		.enum(['newest', 'oldest'], { error: 'order must be newest or oldest.' })
		.default('newest'),
	after: z
		.string()
		.max(200)
		.optional()
		.refine((v) => v === undefined || decodeAuditCursor(v) !== null, {
			error: 'after must be a cursor this list gave (next of a previous page).'
		})
		.describe('The `next` cursor of the page before; absent: from the first entry'),
	limit: z.coerce
		.number({ error: 'limit must be a whole number.' })
		.int('limit must be a whole number.')
		.min(1, 'limit starts at 1.')
		.max(MAX_PAGE_SIZE, `limit is at most ${MAX_PAGE_SIZE}.`)
		.default(DEFAULT_PAGE_SIZE)
		.describe(`Entries per page (at most ${MAX_PAGE_SIZE})`)
});

export const auditListResponse = describes<AuditApiPage>()(
	z.object({
		entries: z.array(
			z.object({
				id: z.string(),
				seq: z.int().describe('place in the hash-chained trail'),
				at: isoTime(),
				actorId: z.string().nullable(),
				actorEmail: z.string().nullable(),
				action: z.string(),
				sentence: z.string().describe('the entry as the trail page reads it'),
				subjectType: z.string().nullable(),
				subjectId: z.string().nullable(),
				detail: z.record(z.string(), z.unknown()).nullable(),
				address: z.string().nullable()
			})
		),
		total: z.int().describe('how many entries the filter matches in all'),
		next: z.string().nullable().describe('pass as `after` for the next page; null on the last')
	})
);

export const auditOperations: ApiOperation[] = [
	{
		method: 'get',
		path: '/api/v1/audit',
		summary:
			'The audit trail filtered as on the trail page, a page at a time (keyset: pass `next` back as `after`)',
		act: 'admin.audit',
		query: auditListQuery,
		response: auditListResponse
	}
];
