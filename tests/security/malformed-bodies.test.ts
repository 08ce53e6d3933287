import { readdirSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { isHttpError, isRedirect, type RequestEvent } from '@sveltejs/kit';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { ROLES } from '$lib/roles';
import { pageFrom } from '$lib/server/paging';
import { handleMalformedBodies } from '$lib/server/request-body-check';
import { enterEvent } from '../server/endpoint-call';
import { makeUser } from '../server/helpers';

vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('../server/endpoint-call')).currentEvent
}));

/*
 * Every form action and every POST/PUT/PATCH endpoint under src/routes gets each kind of body a
 * client can break, through the body check and then the real door, as someone holding every role.
 * Whatever happens, the answer must not be a server error.
 */
const routesRoot = join(process.cwd(), 'src', 'routes');
const BODY_METHODS = ['POST', 'PUT', 'PATCH'] as const;

function serverFiles(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
		const full = join(dir, entry.name);
		if (entry.isDirectory()) return serverFiles(full);
		return entry.name === '+page.server.ts' || entry.name === '+server.ts' ? [full] : [];
	});
}

function pathOf(file: string): { pathname: string; params: Record<string, string> } {
	const params: Record<string, string> = {};
	const segments = relative(routesRoot, file)
		.split(sep)
		.slice(0, -1)
		.filter((s) => !/^\(.*\)$/.test(s))
		.map((s) =>
			s.replace(/\[(\w+)\]/g, (_, name: string) => (params[name] = name === 'n' ? '1' : 'x'))
		);
	return { pathname: `/${segments.join('/')}`, params };
}

type Door = { name: string; pathname: string; params: Record<string, string>; method: string };
type Call = (event: RequestEvent) => unknown;

const BAD_BODIES: { kind: string; contentType: string; body: string }[] = [
	{ kind: 'multipart without a boundary', contentType: 'multipart/form-data', body: 'a=1' },
	{
		kind: 'truncated multipart',
		contentType: 'multipart/form-data; boundary=XyZ',
		body: '--XyZ\r\nContent-Disposition: form-data; name="a"\r\n\r\nhal'
	},
	{
		kind: 'malformed urlencoded',
		contentType: 'application/x-www-form-urlencoded',
		body: '%zz=%%&a=%E0%A4%A'
	},
	{ kind: 'malformed JSON', contentType: 'application/json', body: '{"a": [1,' },
	{ kind: 'empty JSON', contentType: 'application/json', body: '' }
];

const doors: (Door & { call: Call })[] = [];
let everyone: Awaited<ReturnType<typeof makeUser>>;

beforeAll(async () => {
	const person = await makeUser([...ROLES]);
	everyone = person;
	for (const file of serverFiles(routesRoot)) {
		const module = (await import(/* @vite-ignore */ file)) as Record<string, unknown>;
		const { pathname, params } = pathOf(file);
		const where = relative(routesRoot, file);
		for (const [name, action] of Object.entries((module.actions ?? {}) as Record<string, Call>)) {
			const query = name === 'default' ? '' : `?/${name}`;
			doors.push({
				name: `${where} ${name}`,
				pathname: pathname + query,
				params,
				method: 'POST',
				call: action
			});
		}
		for (const method of BODY_METHODS) {
			if (typeof module[method] === 'function')
				doors.push({
					name: `${where} ${method}`,
					pathname,
					params,
					method,
					call: module[method] as Call
				});
		}
	}
}, 60_000);

/** The status the whole chain answers: the body check, then the door itself. */
async function statusOf(door: Door & { call: Call }, contentType: string, body: string) {
	const request = new Request(new URL(door.pathname, 'http://127.0.0.1'), {
		method: door.method,
		headers: { 'content-type': contentType },
		body
	});
	const user = { id: everyone.id, email: everyone.email, name: 'Everyone', roles: everyone.roles };
	const event = enterEvent(request, { user, params: door.params });
	try {
		const answer = await handleMalformedBodies({
			event,
			resolve: async (e) => {
				const out = await door.call(e);
				return out instanceof Response ? out : new Response(null, { status: 200 });
			}
		});
		return answer.status;
	} catch (thrown) {
		if (isHttpError(thrown)) return thrown.status;
		if (isRedirect(thrown)) return thrown.status;
		return 500;
	}
}

describe('a body a client can break', () => {
	it('reaches every action and endpoint that takes one', () => {
		expect(doors.length).toBeGreaterThan(20);
	});

	it.each(BAD_BODIES)('$kind: no server error from any door', async ({ contentType, body }) => {
		const failures: string[] = [];
		for (const door of doors) {
			const status = await statusOf(door, contentType, body);
			if (status >= 500 || (contentType.includes('json') && status === 200))
				failures.push(`${door.name}: ${status}`);
		}
		expect(failures).toEqual([]);
	});

	it('answers problem+json under /api', async () => {
		const api = doors.find((d) => d.pathname.startsWith('/api/'))!;
		const request = new Request(new URL(api.pathname, 'http://127.0.0.1'), {
			method: api.method,
			headers: { 'content-type': 'application/json' },
			body: '{'
		});
		const answer = await handleMalformedBodies({
			event: enterEvent(request, { user: null }),
			resolve: async () => new Response(null, { status: 200 })
		});
		expect(answer.status).toBe(400);
		expect(answer.headers.get('content-type')).toMatch(/^application\/problem\+json/);
		expect(((await answer.json()) as { detail: string }).detail).toMatch(/not valid JSON/);
	});
});

describe('absurd page numbers', () => {
	it.each([
		['9999999999999999999999', 1_000_000],
		['1e400', 1],
		['-3', 1],
		['2.5', 1],
		['abc', 1],
		['7', 7]
	])('?page=%s reads as page %i', (raw, expected) => {
		expect(pageFrom(new URL(`http://x/admin/audit?page=${raw}`))).toBe(expected);
	});
});
