import { isHttpError, json, type RequestEvent, type RequestHandler } from '@sveltejs/kit';
import { z } from 'zod';
import { ChemistryInputError } from '$chemistry';
import type { Act } from '$lib/permissions';
import { requirePermission, type SignedInUser } from '../guard';
import { RuleError } from '../rule-error';
import { problem, type FieldProblem } from './problem';

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

const joinPath = (path: readonly PropertyKey[]) => path.map(String).join('.') || '(body)';

/**
 * One problem per offending input at the dotted path a client can act on. An unknown key comes out
 * at its own path (`oxygen.o2MoleFractin`), not at the object holding it; a value that fits none of
 * a union's shapes is reported against the closest shape, the one with the fewest problems.
 */
export function zodProblems(
	issues: readonly z.core.$ZodIssue[],
	prefix: readonly PropertyKey[] = []
): FieldProblem[] {
	return issues.flatMap((issue): FieldProblem[] => {
		const path = [...prefix, ...issue.path];
		if (issue.code === 'unrecognized_keys') {
			return issue.keys.map((key) => ({
				path: joinPath([...path, key]),
				message: `Unknown field "${key}": this request has no such field; check its spelling.`
			}));
		}
		if (issue.code === 'invalid_union' && issue.errors.length > 0) {
			const candidates = issue.errors.map((memberIssues) => zodProblems(memberIssues, path));
			return candidates.reduce((closest, problems) =>
				problems.length < closest.length ? problems : closest
			);
		}
		return [{ path: joinPath(path), message: issue.message }];
	});
}

const namesItsField = ({ path, message }: FieldProblem) =>
	new RegExp(`(?<![\\w.])${path.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}(?!\\w)`).test(message);

/** A single refusal that names its own field (as the science's do) is the detail as it stands. */
function describeProblems(errors: FieldProblem[]): string {
	if (errors.length === 1 && namesItsField(errors[0])) return errors[0].message;
	return `The request has ${errors.length} invalid field${errors.length === 1 ? '' : 's'}: ${errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`;
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
				const errors = cause.field ? [{ path: cause.field, message: cause.message }] : undefined;
				return problem(cause.status, cause.message, { errors });
			}
			if (isHttpError(cause)) return problem(cause.status, cause.body.message);
			throw cause;
		}
	};
}
