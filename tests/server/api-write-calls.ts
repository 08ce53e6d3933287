import type { RequestHandler } from '@sveltejs/kit';
import type { z } from 'zod';
import { enterEvent } from './endpoint-call';

/*
 * Calls to the API's write routes through their real handlers, with the headers a script sends
 * (If-Match). A test file using it mocks `$app/server` as endpoint-call.ts says.
 */

type Route = Record<string, RequestHandler>;
const routeModules = import.meta.glob<Route>('../../src/routes/api/v1/**/+server.ts');

export interface Caller {
	id: string;
	email: string;
	name: string;
	roles: string[];
}

/** A route file's path with its params filled in: `/api/v1/runs/[id]` + { id } → `/api/v1/runs/…`. */
function concrete(route: string, params: Record<string, string>): string {
	return Object.entries(params).reduce((path, [k, v]) => path.replace(`[${k}]`, v), route);
}

/** Calls `method` of the route file `route` (e.g. /api/v1/recipes/[id]) as `user`. */
export async function callRoute(
	method: 'GET' | 'POST' | 'PUT',
	route: string,
	options: {
		user: Caller | null;
		params?: Record<string, string>;
		body?: unknown;
		ifMatch?: string;
	}
): Promise<Response> {
	const module = routeModules[`../../src/routes${route}/+server.ts`];
	if (!module) throw new Error(`no route file for ${route}`);
	const handler = (await module())[method];
	if (!handler) throw new Error(`${route} has no ${method}`);
	const params = options.params ?? {};
	const headers: Record<string, string> = {};
	if (options.body !== undefined) headers['content-type'] = 'application/json';
	if (options.ifMatch !== undefined) headers['if-match'] = options.ifMatch;
	const request = new Request(new URL(concrete(route, params), 'http://127.0.0.1'), {
		method,
		headers,
		...(options.body === undefined ? {} : { body: JSON.stringify(options.body) })
	});
	return handler(enterEvent(request, { user: options.user, params }));
}

export interface Problem {
	type: string;
	status: number;
	detail: string;
	errors?: { path: string; message: string }[];
	signAt?: string;
}

/** The problem an answer carries; fails when it is not problem+json. */
export async function problemOf(response: Response): Promise<Problem> {
	const type = response.headers.get('content-type') ?? '';
	if (!type.startsWith('application/problem+json'))
		throw new Error(`not a problem (${response.status} ${type}): ${await response.text()}`);
	return (await response.json()) as Problem;
}

/** The answer's body parsed with the operation's response schema (a shape problem throws). */
export async function bodyAs<S extends z.ZodType>(schema: S, response: Response) {
	return schema.parse(await response.json()) as z.output<S>;
}

/** A form's field errors as the API lists them: one `{ path, message }` per message. */
export function asProblems(fieldErrors: Record<string, string[]>, path = (p: string) => p) {
	return Object.entries(fieldErrors).flatMap(([field, messages]) =>
		messages.map((message) => ({ path: path(field), message }))
	);
}

/** Problems in a stable order, for comparing two lists of the same refusals. */
export const byPath = (problems: { path: string; message: string }[]) =>
	[...problems].sort((a, b) => a.path.localeCompare(b.path) || a.message.localeCompare(b.message));
