// The app's own calls to its JSON API, typed by the OpenAPI document (`paths` from schema.d.ts,
// written by `npm run api:types`): a path, its parameters, its body and its answer are checked at
// compile time. `resultOf` turns an answer into data, or into the problem's message and field errors.
import createClient, { type ClientOptions } from 'openapi-fetch';
import { problemsByPath, type FieldProblem } from '$lib/field-problems';
import type { paths } from './schema';

/** What the app reads: JSON answers and problems (a CSV export is a link, not a call). */
type Json = 'application/json' | 'application/problem+json';

/** A client for the API: same origin, cookies sent, JSON bodies. */
export function createApiClient(options: ClientOptions = {}) {
	return createClient<paths, Json>({
		baseUrl: '',
		credentials: 'include',
		// Read fetch at each call, not once, so the page's fetch is the one used.
		fetch: (request: Request) => globalThis.fetch(request),
		...options
	});
}

/** The client the browser pages use. */
export const api = createApiClient();

/** The JSON body an operation takes, for a request built before the call. */
export type RequestBodyOf<
	P extends keyof paths,
	M extends 'post' | 'put' | 'patch'
> = paths[P][M] extends { requestBody?: { content: { 'application/json': infer B } } } ? B : never;

export interface ApiFailure {
	ok: false;
	/** 0 when the server could not be reached */
	status: number;
	message: string;
	/** the problem's `errors`, as sent */
	errors: FieldProblem[];
	/** the same by path, two at one path read as one text */
	fieldErrors: Record<string, string>;
}

export type ApiResult<T> = { ok: true; data: T } | ApiFailure;

interface Problem {
	detail?: string;
	errors?: FieldProblem[];
}

const UNREACHABLE = 'The server could not be reached; check the connection and try again.';

/**
 * The outcome of a client call: its data, or what went wrong as a person reads it (the problem's
 * `detail`, and its field errors). An aborted call still throws its AbortError.
 */
export async function resultOf<T>(
	call: Promise<{ data?: T; error?: unknown; response: Response }>
): Promise<ApiResult<T>> {
	let answer: Awaited<typeof call>;
	try {
		answer = await call;
	} catch (cause) {
		if ((cause as Error).name === 'AbortError') throw cause;
		return { ok: false, status: 0, message: UNREACHABLE, errors: [], fieldErrors: {} };
	}
	const { data, error, response } = answer;
	if (response.ok) return { ok: true, data: data as T };
	const problem = (error && typeof error === 'object' ? error : {}) as Problem;
	const errors = problem.errors ?? [];
	return {
		ok: false,
		status: response.status,
		message: problem.detail ?? `The server answered ${response.status}.`,
		errors,
		fieldErrors: problemsByPath(errors)
	};
}
