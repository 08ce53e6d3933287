import { z } from 'zod';
import { cursorFields } from '../../cursor';
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
	...cursorFields('after', decodeAuditCursor, 'next')
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
