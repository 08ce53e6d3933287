import { z } from 'zod';
import { accessFor, type Act } from '$lib/permissions';
import { operationIdOf, tagOf, TAG_DESCRIPTIONS } from './operation-naming';
import { problemResponseComponents, problemSchema, problemStatusesOf } from './openapi-problems';
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
	/** A write that takes no body (submit, close): the path and If-Match say it all. */
	noBody?: true;
	/**
	 * Problems beyond the ones every operation of its kind has (400, 401, 403; 404 with a path id;
	 * 413 and 415 with a body; 429 always).
	 */
	errors?: (404 | 409 | 412 | 422 | 428 | 503)[];
	/** Media types besides JSON that it reads or answers as text (e.g. `text/csv`), with what they hold. */
	textBodies?: { request?: Record<string, string>; response?: Record<string, string> };
}

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

/** Text media types as the document describes them: a string holding what `description` says. */
function textContent(bodies: Record<string, string> = {}): Record<string, unknown> {
	return Object.fromEntries(
		Object.entries(bodies).map(([type, description]) => [
			type,
			{ schema: { type: 'string', description } }
		])
	);
}

/** The success answer: a 204 has no content; any other status its JSON schema and text types. */
function successResponse(op: ApiOperation): Record<string, unknown> {
	const status = op.successStatus ?? 200;
	const description = op.responseDescription ?? (status === 204 ? 'No content' : 'Success');
	if (status === 204) return { [status]: { description } };
	const content = {
		...(op.response ? { 'application/json': { schema: toSchema(op.response, 'output') } } : {}),
		...textContent(op.textBodies?.response)
	};
	return {
		[status]: { description, ...(Object.keys(content).length ? { content } : {}) }
	};
}

/** One operation of the document: names, access, parameters, request body and responses. */
function describeOperation(op: ApiOperation): Record<string, unknown> {
	const access = accessFor(op.act);
	const problems = problemStatusesOf(
		{ path: op.path, hasRequestBody: !!op.request, hasQuery: !!op.query, errors: op.errors },
		access
	);
	return {
		operationId: operationIdOf(op.method, op.path),
		tags: [tagOf(op.path)],
		summary: op.summary,
		'x-access': access,
		'x-act': op.act,
		...(op.noBody ? { 'x-no-body': true } : {}),
		...(op.successStatus === 403 ? { 'x-signature-required': true } : {}),
		security: access === 'public' ? [] : [{ bearerToken: [op.act] }, { sessionCookie: [] }],
		...(op.path.includes('{') || op.query ? { parameters: parametersOf(op) } : {}),
		...(op.request
			? {
					requestBody: {
						required: true,
						content: {
							'application/json': { schema: toSchema(op.request, 'input') },
							...textContent(op.textBodies?.request)
						}
					}
				}
			: {}),
		responses: {
			...successResponse(op),
			...Object.fromEntries(
				problems.map((s) => [String(s), { $ref: `#/components/responses/Problem${s}` }])
			)
		}
	};
}

/** The groups in the order their first operation comes, each with what it holds when known. */
function tagsOf(operations: ApiOperation[]): { name: string; description?: string }[] {
	const names = [...new Set(operations.map((op) => tagOf(op.path)))];
	return names.map((name) =>
		TAG_DESCRIPTIONS[name] ? { name, description: TAG_DESCRIPTIONS[name] } : { name }
	);
}

const API_DESCRIPTION = [
	'JSON endpoints of Brothwright.',
	'Send a personal or service token as `Authorization: Bearer <token>` (a script may instead sign in with POST /api/v1/session and send the session cookie); a token in the address is refused.',
	'Updates carry `If-Match` with the ETag a GET gave (412 when it is stale, 428 when missing); lists read a page at a time pass `next` back as `after`.',
	'Errors are application/problem+json (RFC 9457) with a field path for each invalid input; too many requests answer 429 with `Retry-After`.'
].join(' ');

export function buildOpenApiDocument(origin: string) {
	const operations = allOperations();
	const paths: Record<string, Record<string, unknown>> = {};
	for (const op of operations) {
		paths[op.path] ??= {};
		paths[op.path][op.method] = describeOperation(op);
	}
	return {
		openapi: '3.1.0',
		info: { title: 'Brothwright API', version: '1', description: API_DESCRIPTION },
		servers: [{ url: origin }],
		tags: tagsOf(operations),
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
			responses: problemResponseComponents({
				403: { 'signature-required': signatureRequiredExample }
			})
		}
	};
}
