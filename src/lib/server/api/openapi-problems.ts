// The problems the OpenAPI document lists: the one problem+json shape, a response per status with a
// realistic example body, and which of them an operation can answer.
import type { Access } from '$lib/permissions';
import { problemBody } from './problem';

export const problemSchema = {
	type: 'object',
	description: 'RFC 9457 problem details',
	required: ['type', 'title', 'status', 'detail'],
	properties: {
		type: { type: 'string', description: 'a URN naming the kind of problem' },
		title: { type: 'string', description: 'the HTTP status text' },
		status: { type: 'integer' },
		detail: { type: 'string', description: 'what went wrong, in a sentence a person can act on' },
		errors: {
			type: 'array',
			description: 'one entry per invalid input, at its dotted path (`lines.2.amount`)',
			items: {
				type: 'object',
				required: ['path', 'message'],
				properties: { path: { type: 'string' }, message: { type: 'string' } }
			}
		}
	}
} as const;

interface ProblemResponse {
	description: string;
	example: ReturnType<typeof problemBody>;
	headers?: Record<string, unknown>;
}

const RETRY_AFTER = {
	'Retry-After': {
		description: 'Seconds to wait before sending again',
		schema: { type: 'integer', minimum: 1 }
	}
};

/** Every problem status the document names, what it means and a body as the API answers it. */
export const PROBLEM_RESPONSES: Record<number, ProblemResponse> = {
	400: {
		description: 'Invalid input; `errors` lists each field path',
		example: problemBody(
			400,
			'The lot has 2 problems: quantity: Enter the quantity received.; expiresOn: The expiry date is before the date received.',
			{
				errors: [
					{ path: 'quantity', message: 'Enter the quantity received.' },
					{ path: 'expiresOn', message: 'The expiry date is before the date received.' }
				]
			}
		)
	},
	401: {
		description: 'Not signed in: no session cookie or bearer token, or one that has ended',
		example: problemBody(401, 'Sign in first: this needs a signed-in user.')
	},
	403: {
		description:
			'Signed in without a role this needs, a token without the scope, a write from another site, or an act that needs an electronic signature (type urn:brothwright:problem:signature-required, `signAt`: the page of the app where it is given)',
		example: problemBody(
			403,
			'This needs the role Media scientist or Process engineer. You are signed in as technician@site.example with: Prep technician.'
		)
	},
	404: {
		description: 'No such record (or not one this person may see)',
		example: problemBody(404, 'No lot with this id.')
	},
	409: {
		description:
			'Changed by someone else meanwhile, or in a state that forbids this; reload and retry',
		example: problemBody(
			409,
			'You already have a scenario called “Pilot fed-batch”; choose another name.',
			{
				errors: [
					{
						path: 'name',
						message: 'You already have a scenario called “Pilot fed-batch”; choose another name.'
					}
				]
			}
		)
	},
	412: {
		description:
			'If-Match names a revision that is no longer the record’s: GET it again and redo the change',
		example: problemBody(
			412,
			'Someone else saved this record meanwhile: it is at "4", your change was made on "3". GET it again, apply your change and send it with the new ETag.'
		)
	},
	413: {
		description: 'The body is larger than the operation takes',
		example: problemBody(413, 'The body is larger than 1000000 bytes.')
	},
	415: {
		description: 'The body is not sent as JSON (`Content-Type: application/json`)',
		example: problemBody(415, 'Send the body as JSON with Content-Type: application/json.')
	},
	422: {
		description:
			'Well-formed input that the science cannot use, e.g. a run the integrator cannot follow, a run past the site’s time limit or a profile missing data; `detail` says why',
		example: problemBody(
			422,
			'The simulation took longer than the time limit of 10 s and was stopped: try a shorter end time (endH), fewer or smoother feed streams, or a coarser output interval (outputEveryH). An administrator sets the limit under Settings.'
		)
	},
	428: {
		description: 'An update needs If-Match with the ETag GET gave',
		example: problemBody(
			428,
			'Send If-Match with the ETag of the record you changed (GET it first): an update without it could overwrite someone else’s change.'
		)
	},
	429: {
		description:
			'Too many requests: the per-token rate limit, or too many sign-in tries; wait the seconds `Retry-After` gives',
		example: problemBody(429, 'Too many requests with this token: wait 30 s and send again.'),
		headers: RETRY_AFTER
	},
	503: {
		description: 'Every calculation thread is busy and the queue is full; try again in a minute',
		example: problemBody(503, 'The server is busy with other calculations; try again in a minute.')
	}
};

/** The operation facts the problem list depends on. */
interface ProblemSource {
	path: string;
	hasRequestBody: boolean;
	hasQuery: boolean;
	errors?: readonly number[];
}

/**
 * The problems an operation can answer: by its kind (bad input, not signed in, wrong role), its
 * path (an id), its body (not JSON, too large), the per-token limit every request is under, and
 * what it names itself.
 */
export function problemStatusesOf(op: ProblemSource, access: Access): number[] {
	return [
		...new Set([
			...(op.hasRequestBody || op.hasQuery ? [400] : []),
			...(access === 'public' ? [] : [401]),
			...(Array.isArray(access) ? [403] : []),
			...(op.path.includes('{') ? [404] : []),
			...(op.hasRequestBody ? [413, 415] : []),
			429,
			...(op.errors ?? [])
		])
	].sort((a, b) => a - b);
}

/** `components.responses`: one `Problem<status>` per status, with its example and headers. */
export function problemResponseComponents(
	/** Further named examples of a status, beside its usual one (403: signature required). */
	more: Partial<Record<number, Record<string, { summary: string; value: unknown }>>> = {}
): Record<string, unknown> {
	return Object.fromEntries(
		Object.entries(PROBLEM_RESPONSES).map(([status, { description, example, headers }]) => {
			const extra = more[Number(status)];
			return [
				`Problem${status}`,
				{
					description,
					...(headers ? { headers } : {}),
					content: {
						'application/problem+json': {
							schema: { $ref: '#/components/schemas/Problem' },
							...(extra
								? { examples: { usual: { summary: description, value: example }, ...extra } }
								: { example })
						}
					}
				}
			];
		})
	);
}
