import { isRedirect, type RequestHandler } from '@sveltejs/kit';
import { and, eq } from 'drizzle-orm';
import { expect } from 'vitest';
import { allOperations } from '$lib/server/api/openapi';
import { db } from '$lib/server/db';
import { auditEvent } from '$lib/server/db/schema';
import { enterEvent } from './endpoint-call';

/*
 * Calls for the record-writing API and the pages that write the same records. A test file that uses
 * them mocks `$app/server` as endpoint-call.ts says.
 */

export type Person = { id: string; email: string; name: string; roles: string[] };

export interface ApiCall {
	user: Person | null;
	params?: Record<string, string>;
	/** sent as JSON unless `text` is given */
	body?: unknown;
	/** a raw body with its own content type, e.g. for a 415 */
	text?: { type: string; content: string };
	ifMatch?: string;
}

/** Calls a route handler as the SvelteKit server would, with If-Match when given. */
export async function callApi(
	handler: RequestHandler,
	method: string,
	path: string,
	call: ApiCall
): Promise<Response> {
	const headers: Record<string, string> = {};
	if (call.ifMatch !== undefined) headers['if-match'] = call.ifMatch;
	let body: string | undefined;
	if (call.text) {
		headers['content-type'] = call.text.type;
		body = call.text.content;
	} else if (call.body !== undefined) {
		headers['content-type'] = 'application/json';
		body = JSON.stringify(call.body);
	}
	const request = new Request(new URL(path, 'http://127.0.0.1'), { method, headers, body });
	return handler(enterEvent(request, { user: call.user, params: call.params }));
}

type PageModule = { actions: Record<string, (event: never) => unknown> };

export type PageOutcome =
	| { kind: 'saved'; location: string }
	| { kind: 'refused'; status: number; message: string; fieldErrors: Record<string, string[]> };

/** Submits a page's `save` action with these form fields, as the browser posts them. */
export async function submitPage(
	page: PageModule,
	fields: Record<string, string>,
	as: { user: Person; params?: Record<string, string> }
): Promise<PageOutcome> {
	const form = new FormData();
	for (const [key, value] of Object.entries(fields)) form.set(key, value);
	const request = new Request('http://127.0.0.1/page', { method: 'POST', body: form });
	const event = enterEvent(request, { user: as.user, params: as.params });
	try {
		const result = (await page.actions.save(event as never)) as {
			status?: number;
			data?: { message: string; fieldErrors: Record<string, string[]> };
		};
		// An edit page answers its save in place; a failure carries its status and the form's errors.
		if (result.status === undefined || !result.data) return { kind: 'saved', location: '' };
		return { kind: 'refused', status: result.status, ...result.data };
	} catch (cause) {
		if (isRedirect(cause)) return { kind: 'saved', location: cause.location };
		throw cause;
	}
}

export interface Problem {
	status: number;
	detail: string;
	errors?: { path: string; message: string }[];
}

/** A problem's field errors the way a page shows them: messages by field. */
export function errorsByPath(problem: Problem): Record<string, string[]> {
	const byPath: Record<string, string[]> = {};
	for (const { path, message } of problem.errors ?? []) (byPath[path] ??= []).push(message);
	return byPath;
}

/** The answer is problem+json with this status; its body. */
export async function problemOf(response: Response, status: number): Promise<Problem> {
	const body = (await response.json()) as Problem;
	expect(response.status, JSON.stringify(body)).toBe(status);
	expect(response.headers.get('content-type')).toBe('application/problem+json');
	return body;
}

/** Parses an answer with the response schema its OpenAPI operation documents. */
export function expectDocumentedShape(method: string, path: string, body: unknown): void {
	const operation = allOperations().find((op) => op.method === method && op.path === path);
	expect(operation?.response, `${method} ${path} documents no response`).toBeDefined();
	const parsed = operation!.response!.safeParse(body);
	expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true);
}

/** The audit trail's actions on one record, oldest first. */
export function auditActionsOf(subjectType: string, subjectId: string): string[] {
	return db
		.select({ action: auditEvent.action })
		.from(auditEvent)
		.where(and(eq(auditEvent.subjectType, subjectType), eq(auditEvent.subjectId, subjectId)))
		.orderBy(auditEvent.seq)
		.all()
		.map((e) => e.action);
}

/** The id at the end of a page's redirect after saving (`/vessels/<id>?saved=1`). */
export function savedId(outcome: PageOutcome): string {
	if (outcome.kind !== 'saved') throw new Error(`refused: ${JSON.stringify(outcome)}`);
	return outcome.location.split('?')[0].split('/').at(-1)!;
}

/** The form's text for a JSON body: numbers and booleans as a person types them. */
export function asForm(body: Record<string, unknown>): Record<string, string> {
	return Object.fromEntries(
		Object.entries(body).map(([k, v]) => [k, v === true ? 'on' : v === false ? '' : String(v)])
	);
}

/** A stored row without what differs between two records saved alike. */
export function comparable(row: Record<string, unknown> | undefined) {
	const { id: _id, name: _name, createdAt: _c, updatedAt: _u, ...rest } = row ?? {};
	return rest;
}

/** Writes with the API and the page alike and expects the same refusal at the same fields. */
export async function expectSameRefusal(
	api: () => Promise<Response>,
	page: () => ReturnType<typeof submitPage>,
	status = 400
) {
	const problem = await problemOf(await api(), status);
	const outcome = await page();
	expect(outcome.kind).toBe('refused');
	if (outcome.kind !== 'refused') return problem;
	expect(outcome.status).toBe(status);
	expect(errorsByPath(problem)).toEqual(outcome.fieldErrors);
	return problem;
}

/** Stale and missing If-Match: 412 and 428, and the record and its trail are as they were. */
export async function expectPreconditions(
	user: Person,
	put: RequestHandler,
	path: string,
	id: string,
	body: unknown,
	read: () => unknown,
	subjectType: string
) {
	const before = read();
	const trail = auditActionsOf(subjectType, id);
	const call = (ifMatch?: string) =>
		callApi(put, 'PUT', path, { user, params: { id }, body, ifMatch });
	const stale = await problemOf(await call('"1"'), 412);
	expect(stale.detail).toMatch(/Someone else saved this record meanwhile/);
	await problemOf(await call(), 428);
	await problemOf(await call('not-a-tag'), 412);
	expect(read()).toEqual(before);
	expect(auditActionsOf(subjectType, id)).toEqual(trail);
}

/** Every page of a cursor list, following `next`; each page parsed with its documented schema. */
export async function walk(user: Person, handler: RequestHandler, path: string, query: string) {
	const items: { id: string; name: string; updatedAt: string }[] = [];
	let after: string | null = null;
	let total = 0;
	do {
		const cursor: string = after ? `&after=${encodeURIComponent(after)}` : '';
		const response = await callApi(handler, 'GET', `${path}?${query}&limit=2${cursor}`, { user });
		const page = await response.json();
		expect(response.status, JSON.stringify(page)).toBe(200);
		expectDocumentedShape('get', path, page);
		expect(page.items.length).toBeLessThanOrEqual(2);
		items.push(...page.items);
		total = page.total;
		after = page.next;
	} while (after);
	return { items, total };
}

/** SQLite's order of `lower(name)`, then id: both compared as plain text. */
export const byNameThenId = (a: { name: string; id: string }, b: { name: string; id: string }) => {
	const [x, y] = [a.name.toLowerCase(), b.name.toLowerCase()];
	return x < y ? -1 : x > y ? 1 : a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
};
