import type { RequestEvent, RequestHandler } from '@sveltejs/kit';

/*
 * Calls a route handler as the SvelteKit server would. The endpoints' guard reads the request
 * through getRequestEvent, which only that server sets, so a test file mocks `$app/server` with
 *   vi.mock('$app/server', async (importOriginal) => ({
 *     ...(await importOriginal<typeof import('$app/server')>()),
 *     getRequestEvent: (await import('./endpoint-call')).currentEvent
 *   }));
 * and every call made here becomes the current event.
 */
let current: RequestEvent | null = null;

export const currentEvent = () => current;

export interface CallAs {
	/** the signed-in person as `locals.user`; null for nobody */
	user: unknown;
	params?: Record<string, string>;
}

/** The event for a request, made the current one. */
export function enterEvent(request: Request, { user, params = {} }: CallAs): RequestEvent {
	const url = new URL(request.url);
	const jar = new Map<string, string>();
	// Enough of SvelteKit's cookies for a handler that sets or reads one (sign-in).
	const cookies = {
		get: (name: string) => jar.get(name),
		set: (name: string, value: string) => void jar.set(name, value),
		delete: (name: string) => void jar.delete(name),
		getAll: () => [...jar].map(([name, value]) => ({ name, value }))
	};
	current = {
		request,
		url,
		params,
		cookies,
		locals: { user, session: null },
		getClientAddress: () => '127.0.0.1'
	} as unknown as RequestEvent;
	return current;
}

/** POSTs `body` as JSON to the handler at `path` (e.g. /api/v1/simulate). */
export function postJson(
	handler: RequestHandler,
	path: string,
	body: unknown,
	as: CallAs
): Promise<Response> {
	const request = new Request(new URL(path, 'http://127.0.0.1'), {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify(body)
	});
	return Promise.resolve(handler(enterEvent(request, as)));
}

/** Calls the handler at `path` with `method`, sending `body` (when given) as JSON. */
export function callJson(
	handler: RequestHandler,
	method: string,
	path: string,
	body: unknown,
	as: CallAs
): Promise<Response> {
	const request = new Request(new URL(path, 'http://127.0.0.1'), {
		method: method.toUpperCase(),
		...(body === undefined
			? {}
			: { headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) })
	});
	return Promise.resolve(handler(enterEvent(request, as)));
}
