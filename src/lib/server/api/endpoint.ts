import { isHttpError, json, type RequestEvent, type RequestHandler } from '@sveltejs/kit';
import { z } from 'zod';
import { ChemistryInputError } from '$chemistry';
import type { Act } from '$lib/permissions';
import { config } from '../config';
import { requirePermission, type SignedInUser } from '../guard';
import { RuleError } from '../rule-error';
import { describeProblems, zodProblems } from '$lib/field-problems';
import { problem, type FieldProblem } from './problem';

export { zodProblems };

/** A user mistake an endpoint detects itself; answered as a 4xx problem. */
export class ApiProblem extends Error {
	constructor(
		readonly status: number,
		message: string,
		readonly errors?: FieldProblem[]
	) {
		super(message);
	}
}

/** Where in a text field (a feed expression) the one refusal points, when its rule knows. */
function positionOf(issues: readonly z.core.$ZodIssue[]): number | undefined {
	const [issue] = issues;
	return issues.length === 1 &&
		issue.code === 'custom' &&
		typeof issue.params?.position === 'number'
		? issue.params.position
		: undefined;
}

interface EndpointOptions<S extends z.ZodType | undefined> {
	/** What the endpoint does: who may is in `$lib/permissions`, and its OpenAPI operation names the same act. */
	act: Act;
	body?: S;
	maxBodyBytes?: number;
}

type Context<S> = {
	event: RequestEvent;
	user: S extends undefined ? SignedInUser | null : SignedInUser | null;
	body: S extends z.ZodType ? z.infer<S> : undefined;
};

async function readJson(event: RequestEvent, maxBytes: number): Promise<unknown> {
	const type = event.request.headers.get('content-type') ?? '';
	if (!type.includes('application/json')) {
		throw new ApiProblem(415, 'Send the body as JSON with Content-Type: application/json.');
	}
	const text = await event.request.text();
	if (text.length > maxBytes)
		throw new ApiProblem(413, `The body is larger than ${maxBytes} bytes.`);
	try {
		return JSON.parse(text);
	} catch (cause) {
		throw new ApiProblem(400, `The body is not valid JSON: ${(cause as Error).message}`);
	}
}

const WRITES = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/**
 * A browser that sends a write from another site says where from (`Origin`); only this origin and
 * the API clients listed in API_CLIENT_ORIGINS may write. A request without `Origin` is not from a
 * browser page (scripts, other systems), which the session cookie's SameSite already limits.
 */
function requireSameOrigin(event: RequestEvent): void {
	// A bearer token is never sent by a browser on its own, so a cross-site page cannot forge one.
	if (!WRITES.has(event.request.method) || event.locals.apiToken) return;
	const from = event.request.headers.get('origin');
	if (from === null || from === event.url.origin || config.apiClientOrigins.includes(from)) return;
	throw new ApiProblem(
		403,
		`Writes from ${from} are not accepted: only this site and the API clients its administrator lists may write.`
	);
}

/**
 * Wraps a JSON endpoint: the role guard (again, at the endpoint), body parsing and zod validation,
 * and the mapping of every user mistake to problem+json. Anything else is a real fault (500).
 */
export function endpoint<S extends z.ZodType | undefined = undefined>(
	options: EndpointOptions<S>,
	handler: (context: Context<S>) => unknown | Promise<unknown>
): RequestHandler {
	return async (event) => {
		try {
			requireSameOrigin(event);
			const user: SignedInUser | null = requirePermission(options.act);
			let body: unknown;
			if (options.body) {
				const raw = await readJson(event, options.maxBodyBytes ?? 1_000_000);
				const parsed = options.body.safeParse(raw);
				if (!parsed.success) {
					const errors = zodProblems(parsed.error.issues);
					return problem(400, describeProblems(errors), {
						errors,
						position: positionOf(parsed.error.issues)
					});
				}
				body = parsed.data;
			}
			const result = await handler({ event, user, body } as Context<S>);
			return result instanceof Response ? result : json(result);
		} catch (cause) {
			if (cause instanceof ApiProblem)
				return problem(cause.status, cause.message, { errors: cause.errors });
			if (cause instanceof ChemistryInputError) {
				const errors = cause.field ? [{ path: cause.field, message: cause.message }] : undefined;
				return problem(400, cause.message, { errors, position: cause.position });
			}
			if (cause instanceof RuleError) {
				// Every field a rule names, as the page shows each beside its own.
				const errors = cause.fieldErrors
					? Object.entries(cause.fieldErrors).flatMap(([path, messages]) =>
							messages.map((message) => ({ path, message }))
						)
					: cause.field
						? [{ path: cause.field, message: cause.message }]
						: undefined;
				return problem(cause.status, cause.message, { errors });
			}
			if (isHttpError(cause)) return problem(cause.status, cause.body.message);
			throw cause;
		}
	};
}
