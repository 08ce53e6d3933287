import { STATUS_CODES } from 'node:http';
import type { FieldProblem } from '$lib/field-problems';

export type { FieldProblem };

export const PROBLEM_CONTENT_TYPE = 'application/problem+json';

export interface ProblemDetails {
	type: string;
	title: string;
	status: number;
	detail: string;
	instance?: string;
	errors?: FieldProblem[];
	[extension: string]: unknown;
}

const TYPES: Record<number, string> = {
	400: 'urn:brothwright:problem:invalid-input',
	401: 'urn:brothwright:problem:sign-in-required',
	403: 'urn:brothwright:problem:forbidden',
	404: 'urn:brothwright:problem:not-found',
	409: 'urn:brothwright:problem:conflict',
	412: 'urn:brothwright:problem:stale-edit',
	413: 'urn:brothwright:problem:too-large',
	415: 'urn:brothwright:problem:unsupported-media-type',
	422: 'urn:brothwright:problem:unprocessable',
	428: 'urn:brothwright:problem:if-match-required',
	429: 'urn:brothwright:problem:too-many-requests'
};

/** The body of a problem: its type and title follow from the status. */
export function problemBody(
	status: number,
	detail: string,
	extra: { errors?: FieldProblem[]; [key: string]: unknown } = {}
): ProblemDetails {
	return {
		type: TYPES[status] ?? 'about:blank',
		title: STATUS_CODES[status] ?? 'Error',
		status,
		detail,
		...extra
	};
}

/** RFC 9457 problem details. */
export function problem(
	status: number,
	detail: string,
	extra: { errors?: FieldProblem[]; headers?: Record<string, string>; [key: string]: unknown } = {}
): Response {
	const { headers, ...rest } = extra;
	const body = problemBody(status, detail, rest);
	return new Response(JSON.stringify(body), {
		status,
		headers: { 'content-type': PROBLEM_CONTENT_TYPE, ...headers }
	});
}
