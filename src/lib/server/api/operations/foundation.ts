import { z } from 'zod';
import { ACTS, type Act } from '$lib/permissions';
import { ROLES } from '$lib/roles';
import { API_TOKEN_KINDS } from '../../db/tokens.schema';
import type { SignedInUser } from '../../guard';
import type { ApiOperation, buildOpenApiDocument } from '../openapi';
import { describes, documentsPartOf, isoTime } from '../shapes';

export const sessionRequest = z.object({
	email: z.email().max(254),
	password: z.string().min(1).max(256)
});

export const meResponse = describes<SignedInUser>()(
	z.object({
		id: z.string(),
		email: z.string(),
		name: z.string(),
		roles: z.array(z.enum(ROLES))
	})
);

export const whoAmIResponse = meResponse.extend({
	token: z
		.object({
			id: z.string().describe('the public part of the token (bwt_<id>_…)'),
			name: z.string(),
			kind: z.enum(API_TOKEN_KINDS),
			scopes: z.array(z.enum(ACTS as [Act, ...Act[]])),
			expiresAt: isoTime()
		})
		.nullable()
		.describe('null when the request came with the session cookie')
});

export const healthResponse = z.object({
	status: z.literal('ok'),
	database: z.literal('ok'),
	time: z.string()
});

/** The document's frame; each operation in it is described by its own entry in these lists. */
export const openApiResponse = documentsPartOf<ReturnType<typeof buildOpenApiDocument>>()(
	z
		.object({
			openapi: z.string(),
			info: z.object({ title: z.string(), version: z.string(), description: z.string() }),
			servers: z.array(z.object({ url: z.string() })),
			paths: z.record(z.string(), z.record(z.string(), z.unknown())),
			components: z.record(z.string(), z.unknown())
		})
		.loose()
);

export const foundationOperations: ApiOperation[] = [
	{
		method: 'get',
		path: '/api/v1/health',
		summary: 'Reports that the service and its database answer',
		act: 'service.describe',
		response: healthResponse
	},
	{
		method: 'get',
		path: '/api/v1/me',
		summary:
			'Who is asking: the person (or service account) with their roles, and the API token the request came with, if any',
		act: 'workspace.view',
		response: whoAmIResponse
	},
	{
		method: 'post',
		path: '/api/v1/session',
		summary: 'Signs a script in (sets the session cookie); throttled like the sign-in page',
		act: 'session.start',
		request: sessionRequest,
		response: meResponse
	},
	{
		method: 'delete',
		path: '/api/v1/session',
		summary: 'Signs out (ends the session)',
		act: 'session.end',
		successStatus: 204,
		responseDescription: 'Signed out'
	},
	{
		method: 'get',
		path: '/api/v1/openapi.json',
		summary: 'This description (OpenAPI 3.1)',
		act: 'service.describe',
		response: openApiResponse
	}
];
