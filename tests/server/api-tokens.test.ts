import type { RequestEvent, RequestHandler, ResolveOptions } from '@sveltejs/kit';
import { beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { apiToken, auditEvent, user } from '$lib/server/db/schema';
import { handleBearerTokens } from '$lib/server/auth/bearer';
import { checkBearer, issueToken, revokeToken } from '$lib/server/auth/api-tokens';
import { forgetTokenRequests, takeTokenRequest } from '$lib/server/auth/token-rate';
import { createPersonalToken, createServiceToken } from '$lib/server/auth/token-requests';
import { scopesAllowedFor } from '$lib/server/auth/token-scope-choices';
import { signRecord } from '$lib/server/signatures';
import { listPeople } from '$lib/server/people';
import { signIn } from '$lib/server/auth/sign-in';
import { describeAction } from '$lib/server/trail/describe';
import { enterEvent } from './endpoint-call';
import { makeUser, refusalOf } from './helpers';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

type Route = Record<string, RequestHandler>;
const routeModules = import.meta.glob<Route>('../../src/routes/api/v1/**/+server.ts');
const route = (path: string): Promise<Route> =>
	routeModules[`../../src/routes${path}/+server.ts`]();

/** A request through the bearer hook and then the route, as the server runs them. */
async function send(
	handler: RequestHandler | null,
	method: string,
	path: string,
	headers: Record<string, string>,
	body?: unknown
): Promise<{ response: Response; event: RequestEvent }> {
	const request = new Request(new URL(path, 'http://127.0.0.1'), {
		method,
		headers: { ...(body === undefined ? {} : { 'content-type': 'application/json' }), ...headers },
		body: body === undefined ? undefined : JSON.stringify(body)
	});
	const event = enterEvent(request, { user: null });
	const resolve = async (e: RequestEvent, _opts?: ResolveOptions) =>
		handler ? handler(e as never) : new Response('page');
	const response = await handleBearerTokens({ event, resolve } as never);
	return { response, event };
}

const bearer = (token: string) => ({ authorization: `Bearer ${token}` });
const DAY_MS = 86_400_000;

type Person = Awaited<ReturnType<typeof makeUser>> & { name: string; address: string };
let scientist: Person;
let admin: Person;

async function person(roles: Parameters<typeof makeUser>[0]): Promise<Person> {
	const made = await makeUser(roles);
	return { ...made, name: 'Test person', address: '127.0.0.1' };
}

beforeAll(async () => {
	scientist = await person(['media_scientist']);
	admin = await person(['admin']);
});
beforeEach(() => forgetTokenRequests());

function auditOf(tokenId: string, action: string) {
	return db
		.select()
		.from(auditEvent)
		.where(and(eq(auditEvent.subjectId, tokenId), eq(auditEvent.action, action)))
		.all();
}

describe('personal tokens', () => {
	it('are shown once and stored only as a hash; creation is audited without the secret', () => {
		const token = createPersonalToken(scientist, {
			name: 'ELN export',
			scopes: ['recipe.view'],
			expiresInDays: 30
		});
		expect(token).toMatch(/^bwt_[a-z2-7]{16}_[a-z2-7]{52}$/);
		const id = token.split('_')[1];
		const row = db.select().from(apiToken).where(eq(apiToken.id, id)).get()!;
		const secret = token.split('_')[2];
		expect(JSON.stringify(row)).not.toContain(secret);
		expect(row.secretHash).toMatch(/^[0-9a-f]{64}$/);
		const [created] = auditOf(id, 'token.created');
		expect(JSON.stringify(created.detail)).not.toContain(secret);
		expect(created.detail).toMatchObject({ name: 'ELN export', scopes: ['recipe.view'] });
		expect(describeAction('token.created', created.detail, 'ELN export')).toContain(
			'Made the personal API token “ELN export” with 1 scope (recipe.view)'
		);
	});

	it('open the API as their person, within their scopes; the first use of a scope is audited once', async () => {
		const token = createPersonalToken(scientist, {
			name: 'Reader',
			scopes: ['recipe.view', 'workspace.view'],
			expiresInDays: 1
		});
		const id = token.split('_')[1];
		const me = (await route('/api/v1/me')).GET;
		const first = await send(me, 'GET', '/api/v1/me', bearer(token));
		expect(first.response.status).toBe(200);
		expect(((await first.response.json()) as { email: string }).email).toBe(scientist.email);
		await send(me, 'GET', '/api/v1/me', bearer(token));
		expect(auditOf(id, 'token.scope_first_used')).toHaveLength(1);

		const preview = (await route('/api/v1/recipes/preview')).POST;
		const refused = await send(preview, 'POST', '/api/v1/recipes/preview', bearer(token), {
			lines: []
		});
		expect(refused.response.status).toBe(403);
		const problem = (await refused.response.json()) as { detail: string };
		expect(problem.detail).toContain('does not have the scope calculation.run');
		expect(db.select().from(apiToken).where(eq(apiToken.id, id)).get()!.lastUsedAt).not.toBeNull();
	});

	it('offer only scopes the person’s roles allow, and never signing or account acts', async () => {
		const scopes = scopesAllowedFor(['media_scientist']);
		expect(scopes).toContain('study.use');
		expect(scopes).not.toContain('recipe.sign');
		expect(scopes).not.toContain('lot.receive');
		expect(scopes).not.toContain('account.password');
		const refusal = await refusalOf(() =>
			createPersonalToken(scientist, {
				name: 'Too much',
				scopes: ['lot.receive', 'recipe.view'],
				expiresInDays: 10
			})
		);
		expect(refusal.field).toBe('scopes');
		expect(refusal.message).toContain('lot.receive');
	});

	it('are limited in number per person', async () => {
		const holder = await person(['engineer']);
		for (let i = 0; i < 10; i++)
			createPersonalToken(holder, { name: `t${i}`, scopes: ['run.view'], expiresInDays: 1 });
		const refusal = await refusalOf(() =>
			createPersonalToken(holder, { name: 'eleventh', scopes: ['run.view'], expiresInDays: 1 })
		);
		expect(refusal.status).toBe(409);
		expect(refusal.message).toContain('10 live tokens');
	});
});

describe('refusals', () => {
	it('a revoked token gets 401 saying so, and the revocation is audited with its reason', async () => {
		const token = createPersonalToken(scientist, {
			name: 'Leaked',
			scopes: ['workspace.view'],
			expiresInDays: 5
		});
		const id = token.split('_')[1];
		revokeToken(scientist, id, 'pasted into a chat');
		const me = (await route('/api/v1/me')).GET;
		const { response } = await send(me, 'GET', '/api/v1/me', bearer(token));
		expect(response.status).toBe(401);
		expect(response.headers.get('content-type')).toContain('application/problem+json');
		expect(response.headers.get('www-authenticate')).toContain('invalid_token');
		expect(((await response.json()) as { detail: string }).detail).toContain('was revoked');
		expect(auditOf(id, 'token.revoked')[0].detail).toMatchObject({ reason: 'pasted into a chat' });
	});

	it('an expired token gets 401 saying when it expired', async () => {
		const token = issueToken(scientist, {
			kind: 'personal',
			name: 'Old',
			userId: scientist.id,
			scopes: ['workspace.view'],
			expiresAt: new Date(Date.now() - DAY_MS),
			requestsPerMinute: 60
		});
		const { response } = await send(null, 'GET', '/api/v1/me', bearer(token));
		expect(response.status).toBe(401);
		expect(((await response.json()) as { detail: string }).detail).toContain('expired on');
	});

	it('a wrong secret, a token of another shape or another scheme gets 401', async () => {
		const token = createPersonalToken(scientist, {
			name: 'Right',
			scopes: ['workspace.view'],
			expiresInDays: 1
		});
		const wrong = token.slice(0, -4) + (token.endsWith('aaaa') ? 'bbbb' : 'aaaa');
		expect(checkBearer(`Bearer ${wrong}`)).toMatchObject({ ok: false });
		for (const header of [`Bearer ${wrong}`, 'Bearer abc', `Basic ${token}`, 'Bearer'])
			expect(
				(await send(null, 'GET', '/api/v1/me', { authorization: header })).response.status
			).toBe(401);
	});

	it('a token in the address is refused, whatever the parameter, before anything is read', async () => {
		const token = createPersonalToken(scientist, {
			name: 'Addressed',
			scopes: ['workspace.view'],
			expiresInDays: 1
		});
		for (const path of [
			`/api/v1/me?access_token=${token}`,
			`/api/v1/me?token=whatever`,
			`/recipes?q=${token}`
		]) {
			const { response } = await send(null, 'GET', path, {});
			expect(response.status, path).toBe(400);
			expect(((await response.json()) as { detail: string }).detail).toContain(
				'Authorization: Bearer'
			);
		}
	});

	it('a person who is deactivated loses their tokens at once', async () => {
		const leaver = await person(['engineer']);
		const token = createPersonalToken(leaver, {
			name: 'Leaver',
			scopes: ['workspace.view'],
			expiresInDays: 1
		});
		db.update(user).set({ active: false }).where(eq(user.id, leaver.id)).run();
		expect((await send(null, 'GET', '/api/v1/me', bearer(token))).response.status).toBe(401);
	});
});

describe('rate limits', () => {
	it('answer 429 with Retry-After once a token has spent its minute', async () => {
		const token = createServiceToken(admin, {
			name: 'Chatty controller',
			roles: ['engineer'],
			scopes: ['workspace.view'],
			expiresInDays: 1,
			requestsPerMinute: 3
		});
		const me = (await route('/api/v1/me')).GET;
		for (let i = 0; i < 3; i++)
			expect((await send(me, 'GET', '/api/v1/me', bearer(token))).response.status).toBe(200);
		const { response } = await send(me, 'GET', '/api/v1/me', bearer(token));
		expect(response.status).toBe(429);
		expect(Number(response.headers.get('retry-after'))).toBeGreaterThanOrEqual(1);
		expect(Number(response.headers.get('retry-after'))).toBeLessThanOrEqual(20);
	});

	it('refill one request every 60/limit seconds (token bucket)', () => {
		const t0 = 1_000_000;
		for (let i = 0; i < 6; i++) expect(takeTokenRequest('bucket', 6, t0)).toBeNull();
		expect(takeTokenRequest('bucket', 6, t0)).toBe(10);
		expect(takeTokenRequest('bucket', 6, t0 + 9_000)).toBe(1);
		expect(takeTokenRequest('bucket', 6, t0 + 10_000)).toBeNull();
	});
});

describe('service tokens', () => {
	it('act as their own service account, which cannot sign in, is no reviewer and is not listed as a person', async () => {
		const token = createServiceToken(admin, {
			name: 'Pilot hall controller',
			roles: ['engineer'],
			scopes: ['run.record', 'workspace.view'],
			expiresInDays: 30,
			requestsPerMinute: 600
		});
		const check = checkBearer(`Bearer ${token}`);
		if (!check.ok) throw new Error(check.detail);
		expect(check.user.roles).toEqual(['engineer']);
		const account = db.select().from(user).where(eq(user.id, check.user.id)).get()!;
		expect(account.kind).toBe('service');
		expect(listPeople().map((p) => p.id)).not.toContain(account.id);
		const signInTry = await signIn(account.email, '', '127.0.0.1');
		expect(signInTry.ok).toBe(false);
		revokeToken(admin, check.token.id, 'controller replaced');
		expect(db.select().from(user).where(eq(user.id, account.id)).get()!.active).toBe(false);
	});

	it('cannot hold the administrator role', async () => {
		const refusal = await refusalOf(() =>
			createServiceToken(admin, {
				name: 'Root',
				roles: ['admin'],
				scopes: ['admin.audit'],
				expiresInDays: 1,
				requestsPerMinute: 10
			})
		);
		expect(refusal.field).toBe('roles');
	});
});

describe('a token never signs', () => {
	it('signRecord refuses a request that came with a token, even with the right password', async () => {
		const token = createPersonalToken(scientist, {
			name: 'Would-be signer',
			scopes: ['recipe.view'],
			expiresInDays: 1
		});
		const { event } = await send(null, 'GET', '/api/v1/recipes', bearer(token));
		expect(event.locals.apiToken).toBeTruthy();
		const refusal = await refusalOf(() =>
			signRecord(
				{
					user: { id: scientist.id },
					password: scientist.password,
					subjectType: 'recipe_version',
					subjectId: 'x',
					meaning: 'approved'
				} as never,
				() => null
			)
		);
		expect(refusal.status).toBe(403);
		expect(refusal.message).toContain('never signs');
	});
});
