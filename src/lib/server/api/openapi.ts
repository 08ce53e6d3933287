import { z } from 'zod';
import { accessFor, type Act } from '$lib/permissions';
import { auditOperations } from './operations/audit';
import { chemistryOperations } from './operations/chemistry';
import { componentsOperations } from './operations/components';
import { foundationOperations } from './operations/foundation';
import { inventoryOperations } from './operations/inventory';
import { batchesOperations } from './operations/batches';
import { profilesVesselsOperations } from './operations/profiles-vessels';
import { recipesOperations } from './operations/recipes';
import { simulationOperations } from './operations/simulation';
import { studiesOperations } from './operations/studies';
import { runsOperations } from './operations/runs';
import { recipeWriteOperations } from './operations/recipe-writes';
import { studyWriteOperations } from './operations/study-writes';
import { runWriteOperations } from './operations/run-writes';
import { signatureOperations, signatureRequiredExample } from './operations/signatures';

export interface ApiOperation {
	method: 'get' | 'post' | 'put' | 'patch' | 'delete';
	/** OpenAPI path template, e.g. /api/v1/recipes/{id} */
	path: string;
	summary: string;
	/** The act its endpoint checks (`endpoint({ act })`); `x-access` shows the act's roles from `$lib/permissions`. */
	act: Act;
	request?: z.ZodType;
	/** The query parameters, the same schema the endpoint reads them with (`parseQuery`). */
	query?: z.ZodObject;
	response?: z.ZodType;
	responseDescription?: string;
	successStatus?: number;
	/** Problems beyond the ones every operation of its kind has (400, 401, 403; 404 with a path id). */
	errors?: (404 | 409 | 412 | 422 | 428 | 503)[];
}

const problemSchema = {
	type: 'object',
	description: 'RFC 9457 problem details',
	required: ['type', 'title', 'status', 'detail'],
	properties: {
		type: { type: 'string' },
		title: { type: 'string' },
		status: { type: 'integer' },
		detail: { type: 'string' },
		errors: {
			type: 'array',
			items: {
				type: 'object',
				required: ['path', 'message'],
				properties: { path: { type: 'string' }, message: { type: 'string' } }
			}
		}
	}
} as const;

function toSchema(schema: z.ZodType, io: 'input' | 'output') {
	const { $schema: _ignored, ...rest } = z.toJSONSchema(schema, {
		io,
		unrepresentable: 'any'
	}) as Record<string, unknown>;
	return rest;
}

export function allOperations(): ApiOperation[] {
	return [
		...foundationOperations,
		...chemistryOperations,
		...recipesOperations,
		...componentsOperations,
		...simulationOperations,
		...inventoryOperations,
		...batchesOperations,
		...studiesOperations,
		...profilesVesselsOperations,
		...runsOperations,
		...auditOperations,
		...recipeWriteOperations,
		...studyWriteOperations,
		...runWriteOperations,
		...signatureOperations
	];
}

/** The problems an operation can answer: by its kind, its path and what it names itself. */
function errorStatusesOf(op: ApiOperation, access: ReturnType<typeof accessFor>): number[] {
	return [
		...new Set([
			...(op.request || op.query ? [400] : []),
			...(access === 'public' ? [] : [401]),
			...(Array.isArray(access) ? [403] : []),
			...(op.path.includes('{') ? [404] : []),
			...(op.errors ?? [])
		])
	].sort();
}

/** Path parameters from the template, query parameters from the query schema. */
function parametersOf(op: ApiOperation): Record<string, unknown>[] {
	const path = [...op.path.matchAll(/\{(\w+)\}/g)].map((m) => ({
		name: m[1],
		in: 'path',
		required: true,
		schema: { type: 'string' }
	}));
	const query = Object.entries(op.query?.shape ?? {}).map(([name, field]) => {
		const schema = toSchema(field as z.ZodType, 'input');
		return {
			name,
			in: 'query',
			required: false,
			...(typeof schema.description === 'string' ? { description: schema.description } : {}),
			schema
		};
	});
	return [...path, ...query];
}

/** One operation of the document: access, parameters, request body and responses. */
function describeOperation(op: ApiOperation): Record<string, unknown> {
	const access = accessFor(op.act);
	const problems = (statuses: number[]) =>
		Object.fromEntries(
			statuses.map((s) => [String(s), { $ref: `#/components/responses/Problem${s}` }])
		);
	return {
		summary: op.summary,
		'x-access': access,
		'x-act': op.act,
		security: access === 'public' ? [] : [{ bearerToken: [op.act] }, { sessionCookie: [] }],
		...(op.path.includes('{') || op.query ? { parameters: parametersOf(op) } : {}),
		...(op.request
			? {
					requestBody: {
						required: true,
						content: { 'application/json': { schema: toSchema(op.request, 'input') } }
					}
				}
			: {}),
		responses: {
			[String(op.successStatus ?? 200)]: {
				description: op.responseDescription ?? 'Success',
				...(op.response
					? { content: { 'application/json': { schema: toSchema(op.response, 'output') } } }
					: {})
			},
			...problems(errorStatusesOf(op, access))
		}
	};
}

export function buildOpenApiDocument(origin: string) {
	const paths: Record<string, Record<string, unknown>> = {};
	for (const op of allOperations()) {
		paths[op.path] ??= {};
		paths[op.path][op.method] = describeOperation(op);
	}
	const problemResponse = (description: string) => ({
		description,
		content: { 'application/problem+json': { schema: { $ref: '#/components/schemas/Problem' } } }
	});
	return {
		openapi: '3.1.0',
		info: {
			title: 'Brothwright API',
			version: '1',
			description:
				'JSON endpoints of Brothwright. Sign in with POST /api/v1/session, then send the session cookie. Errors are application/problem+json (RFC 9457) with a field path for each invalid input.'
		},
		servers: [{ url: origin }],
		paths,
		components: {
			securitySchemes: {
				sessionCookie: { type: 'apiKey', in: 'cookie', name: 'brothwright_session' },
				bearerToken: {
					type: 'http',
					scheme: 'bearer',
					description:
						'A personal or service token (Account → API tokens), sent as `Authorization: Bearer <token>`. Its scopes are acts of the permission table: an operation needs the act named in its `x-act`. Never send a token in the address.'
				}
			},
			schemas: { Problem: problemSchema },
			responses: {
				Problem400: problemResponse('Invalid input; `errors` lists each field path'),
				Problem401: problemResponse('Not signed in'),
				Problem403: {
					description:
						'Signed in without a role this needs, or an act that needs an electronic signature (type urn:brothwright:problem:signature-required, `signAt`: the page of the app where it is given)',
					content: {
						'application/problem+json': {
							schema: { $ref: '#/components/schemas/Problem' },
							examples: { 'signature-required': signatureRequiredExample }
						}
					}
				},
				Problem404: problemResponse('No such record (or not one this person may see)'),
				Problem409: problemResponse(
					'Changed by someone else meanwhile, or in a state that forbids this; reload and retry'
				),
				Problem412: problemResponse(
					'If-Match names a revision that is no longer the record’s: GET it again and redo the change'
				),
				Problem428: problemResponse('An update needs If-Match with the ETag GET gave'),
				Problem422: problemResponse(
					'Well-formed input that the science cannot use, e.g. a run the integrator cannot follow, a run past the site’s time limit or a profile missing data; `detail` says why'
				),
				Problem503: problemResponse(
					'Every calculation thread is busy and the queue is full; try again in a minute'
				)
			}
		}
	};
}
