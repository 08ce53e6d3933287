import { readdirSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { isHttpError, isRedirect, type RequestEvent } from '@sveltejs/kit';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { ACTS, may, PERMISSIONS, type Act } from '$lib/permissions';
import { NAVIGATION } from '$lib/navigation';
import { ROLES, type Role } from '$lib/roles';
import { allOperations } from '$lib/server/api/openapi';
import { enterEvent } from '../server/endpoint-call';
import { makeUser } from '../server/helpers';

/*
 * Generated from the permission table and the route tree: every load, action and handler under
 * src/routes is called as each role, as a person with no role and as nobody signed in. The act its
 * guard names decides, by the table, whether that caller passes; the door must then pass or refuse
 * exactly so. A door that names no act, or refuses (or lets in) someone the table does not, fails.
 */

const guardCalls = vi.hoisted(() => [] as string[]);

vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('../server/endpoint-call')).currentEvent
}));

vi.mock('$lib/server/guard', async (importOriginal) => {
	const guard = await importOriginal<typeof import('$lib/server/guard')>();
	return {
		...guard,
		requirePermission: (act: Act) => {
			guardCalls.push(act);
			return guard.requirePermission(act);
		},
		requireActor: (act: Parameters<typeof guard.requireActor>[0]) => {
			guardCalls.push(act);
			return guard.requireActor(act);
		}
	};
});

const routesRoot = join(process.cwd(), 'src', 'routes');
const SERVER_FILES = new Set(['+page.server.ts', '+layout.server.ts', '+server.ts']);
const HTTP_METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;

function serverFiles(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
		const full = join(dir, entry.name);
		if (entry.isDirectory()) return serverFiles(full);
		return SERVER_FILES.has(entry.name) ? [full] : [];
	});
}

/** The URL path of a route directory: groups dropped, each [param] filled in. */
function urlPath(file: string): {
	pathname: string;
	params: Record<string, string>;
	routeId: string;
} {
	const segments = relative(routesRoot, file).split(sep).slice(0, -1);
	const params: Record<string, string> = {};
	const path = segments
		.filter((segment) => !/^\(.*\)$/.test(segment))
		.map((segment) =>
			segment.replace(/\[(\w+)\]/g, (_, name: string) => {
				params[name] = name === 'n' ? '1' : `no-such-${name}`;
				return params[name];
			})
		);
	return { pathname: `/${path.join('/')}`, params, routeId: `/${segments.join('/')}` };
}

interface Door {
	name: string;
	file: string;
	pathname: string;
	/** GET, POST ... as the browser or client sends it */
	method: string;
	call: (event: RequestEvent) => unknown;
	/** the OpenAPI operation this door is, for handlers under /api/v1 */
	operation?: { method: string; path: string };
}

async function doorsOf(file: string): Promise<Door[]> {
	const module = (await import(/* @vite-ignore */ file)) as Record<string, unknown>;
	const { pathname, routeId } = urlPath(file);
	const where = relative(routesRoot, file);
	const doors: Door[] = [];
	if (typeof module.load === 'function') {
		doors.push({
			name: `${where} load`,
			file,
			pathname,
			method: 'GET',
			call: module.load as Door['call']
		});
	}
	for (const [name, action] of Object.entries(
		(module.actions ?? {}) as Record<string, Door['call']>
	)) {
		doors.push({ name: `${where} action ${name}`, file, pathname, method: 'POST', call: action });
	}
	for (const method of HTTP_METHODS) {
		if (typeof module[method] !== 'function') continue;
		const apiPath = routeId.startsWith('/api/v1/')
			? routeId.replace(/\[(\w+)\]/g, '{$1}')
			: undefined;
		doors.push({
			name: `${where} ${method}`,
			file,
			pathname,
			method,
			call: module[method] as Door['call'],
			operation: apiPath ? { method: method.toLowerCase(), path: apiPath } : undefined
		});
	}
	return doors;
}

type Caller = {
	label: string;
	user: { id: string; email: string; name: string; roles: Role[] } | null;
};

function requestFor(door: Door): Request {
	const url = new URL(door.pathname, 'http://127.0.0.1');
	if (door.method === 'GET' || door.method === 'DELETE')
		return new Request(url, { method: door.method });
	if (door.operation) {
		return new Request(url, {
			method: door.method,
			headers: { 'content-type': 'application/json' },
			body: '{}'
		});
	}
	return new Request(url, { method: door.method, body: new FormData() });
}

type Outcome = { passed: boolean; how: string; act: string | undefined };

/** Calls the door as the caller; refused means a 401 or 403 (thrown or answered) or a redirect to sign-in. */
async function knock(door: Door, caller: Caller): Promise<Outcome> {
	guardCalls.length = 0;
	const { params } = urlPath(door.file);
	const event = enterEvent(requestFor(door), { user: caller.user, params });
	Object.assign(event, {
		route: { id: null },
		cookies: {
			get: () => undefined,
			getAll: () => [],
			set: () => {},
			delete: () => {},
			serialize: () => ''
		},
		parent: async () => ({ user: caller.user }),
		depends: () => {},
		untrack: <T>(fn: () => T) => fn(),
		setHeaders: () => {},
		fetch
	});
	const act = () => guardCalls[0];
	try {
		const result = await door.call(event);
		if (result instanceof Response && (result.status === 401 || result.status === 403)) {
			return { passed: false, how: `answered ${result.status}`, act: act() };
		}
		return { passed: true, how: 'answered', act: act() };
	} catch (cause) {
		if (isHttpError(cause) && (cause.status === 401 || cause.status === 403)) {
			return { passed: false, how: `threw ${cause.status}`, act: act() };
		}
		// The guard sends a signed-out page visit to sign-in and back; signing out also ends at /login, without `next`.
		if (isRedirect(cause) && cause.location.startsWith('/login?next='))
			return { passed: false, how: 'sent to sign-in', act: act() };
		// Past the door: a missing record, a refused form or anything else is the door's business.
		return { passed: true, how: 'went on past the guard', act: act() };
	}
}

const files = serverFiles(routesRoot);
const callers: Caller[] = [];
const doorsByFile = new Map<string, Door[]>();

beforeAll(async () => {
	for (const file of files) doorsByFile.set(file, await doorsOf(file));
	callers.push({ label: 'nobody signed in', user: null });
	for (const roles of [...ROLES.map((role) => [role]), []] as Role[][]) {
		const person = await makeUser(roles);
		callers.push({
			label: roles[0] ?? 'no role',
			user: { id: person.id, email: person.email, name: 'Someone', roles }
		});
	}
});

describe('every door of the route tree against the permission table', () => {
	it('finds the doors: pages, layouts and handlers across the tree', () => {
		const doors = [...doorsByFile.values()].flat();
		expect(files.length).toBeGreaterThan(80);
		expect(doors.filter((door) => door.name.endsWith(' load')).length).toBeGreaterThan(50);
		expect(doors.some((door) => door.name.includes(' action '))).toBe(true);
		expect(doors.some((door) => door.operation)).toBe(true);
	});

	for (const file of files) {
		it(`${relative(routesRoot, file)}: each door names an act and lets in exactly whom the table does`, async () => {
			const doors = doorsByFile.get(file)!;
			expect(doors.length, 'a server route file with no load, action or handler').toBeGreaterThan(
				0
			);
			for (const door of doors) {
				const acts = new Set<string | undefined>();
				for (const caller of callers) {
					const outcome = await knock(door, caller);
					expect(
						outcome.act,
						`${door.name} names no act before it lets ${caller.label} in (${outcome.how})`
					).toBeDefined();
					const act = outcome.act as Act;
					expect(ACTS, `${door.name} names ${act}, which the table does not hold`).toContain(act);
					acts.add(act);
					expect(outcome.passed, `${door.name} (${act}) for ${caller.label}: ${outcome.how}`).toBe(
						may(caller.user, act)
					);
				}
				expect([...acts], `${door.name} names a different act for different callers`).toHaveLength(
					1
				);
				if (door.operation) {
					const operation = allOperations().find(
						(op) => op.method === door.operation!.method && op.path === door.operation!.path
					);
					expect(operation, `${door.name} has no OpenAPI operation`).toBeDefined();
					expect(operation!.act, `${door.name}: the OpenAPI operation states another act`).toBe(
						[...acts][0]
					);
				}
			}
		});
	}
});

describe('the menu', () => {
	it('leads each person only to pages that let them in', async () => {
		for (const item of NAVIGATION) {
			const file = files.find(
				(f) => f.endsWith('+page.server.ts') && urlPath(f).pathname === item.href
			);
			expect(file, `no page behind the menu entry ${item.href}`).toBeDefined();
			const load = doorsByFile.get(file!)!.find((door) => door.name.endsWith(' load'))!;
			for (const caller of callers) {
				if (!may(caller.user, item.act)) continue;
				const outcome = await knock(load, caller);
				expect(
					outcome.passed,
					`${caller.label} sees ${item.href} in the menu but is refused it`
				).toBe(true);
			}
		}
	});
});

describe('the table itself', () => {
	it('lets a feed proposal be saved as recipe drafts only by those who both use studies and write recipes', () => {
		for (const role of ROLES) {
			expect(may([role], 'study.save-feed-drafts'), role).toBe(
				may([role], 'study.use') && may([role], 'recipe.edit')
			);
		}
	});

	it('names at least one role for every act that is neither public nor open to any signed-in person', () => {
		for (const [act, access] of Object.entries(PERMISSIONS)) {
			if (typeof access !== 'string') expect(access.length, act).toBeGreaterThan(0);
		}
	});
});
