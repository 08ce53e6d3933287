// Client-side calls to the JSON endpoints; a problem+json answer becomes a message and field errors.
import { problemsByPath, type FieldProblem } from '$lib/field-problems';

export interface ApiFailure {
	ok: false;
	status: number;
	message: string;
	fieldErrors: Record<string, string>;
}

export type ApiResult<T> = { ok: true; data: T } | ApiFailure;

interface Problem {
	detail?: string;
	errors?: FieldProblem[];
}

export async function callApi<T>(
	method: 'GET' | 'POST' | 'PATCH' | 'DELETE',
	path: string,
	body?: unknown,
	signal?: AbortSignal
): Promise<ApiResult<T>> {
	let response: Response;
	try {
		response = await fetch(path, {
			method,
			headers: body === undefined ? {} : { 'content-type': 'application/json' },
			body: body === undefined ? undefined : JSON.stringify(body),
			signal
		});
	} catch (cause) {
		if ((cause as Error).name === 'AbortError') throw cause;
		return {
			ok: false,
			status: 0,
			message: 'The server could not be reached; check the connection and try again.',
			fieldErrors: {}
		};
	}
	if (response.status === 204) return { ok: true, data: undefined as T };
	const payload: unknown = await response.json().catch(() => null);
	if (response.ok) return { ok: true, data: payload as T };
	const problem = (payload ?? {}) as Problem;
	const fieldErrors = problemsByPath(problem.errors ?? []);
	return {
		ok: false,
		status: response.status,
		message: problem.detail ?? `The server answered ${response.status}.`,
		fieldErrors
	};
}
