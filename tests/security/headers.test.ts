// The hardening headers of every answer, with ORIGIN on https and on plain http. The browser-side
// check (CSP with nonces, pages hydrating under it) is tests/security/headers.spec.ts.
import type { RequestEvent } from '@sveltejs/kit';
import { afterEach, describe, expect, it } from 'vitest';
import { setSessionCookie } from '$lib/server/auth/sessions';
import { handleHardeningHeaders, PERMISSIONS_POLICY } from '$lib/server/security-headers';

const ORIGINAL_ORIGIN = process.env.ORIGIN;
afterEach(() => {
	if (ORIGINAL_ORIGIN === undefined) delete process.env.ORIGIN;
	else process.env.ORIGIN = ORIGINAL_ORIGIN;
});

async function answer(signedIn: boolean, body = new Response('<p>ok</p>')): Promise<Headers> {
	const event = {
		locals: { user: signedIn ? { id: 'u1', email: 'a@lab.test', name: 'A', roles: [] } : null }
	} as unknown as RequestEvent;
	const response = await handleHardeningHeaders({ event, resolve: async () => body });
	return response.headers;
}

describe('hardening headers', () => {
	it('sends HSTS for a year when the site is served over https', async () => {
		process.env.ORIGIN = 'https://brothwright.site.example';
		const headers = await answer(false);
		// RFC 6797 §6.1: max-age in seconds; includeSubDomains as a bare directive.
		expect(headers.get('strict-transport-security')).toBe('max-age=31536000; includeSubDomains');
	});

	it('sends no HSTS over plain http, where a browser would ignore it or lock the site out', async () => {
		process.env.ORIGIN = 'http://127.0.0.1:3000';
		expect((await answer(true)).get('strict-transport-security')).toBeNull();
	});

	it('marks the session cookie Secure only over https', () => {
		const cookieSet: { options?: { secure: boolean } }[] = [];
		const cookies = {
			set: (_n: string, _v: string, options: { secure: boolean }) => cookieSet.push({ options })
		} as unknown as Parameters<typeof setSessionCookie>[0];
		process.env.ORIGIN = 'https://brothwright.site.example';
		setSessionCookie(cookies, 't', new Date(Date.now() + 60_000));
		process.env.ORIGIN = 'http://127.0.0.1:3000';
		setSessionCookie(cookies, 't', new Date(Date.now() + 60_000));
		expect(cookieSet.map((c) => c.options?.secure)).toEqual([true, false]);
	});

	it('keeps signed-in answers out of caches, and leaves public ones alone', async () => {
		expect((await answer(true)).get('cache-control')).toBe('private, no-store');
		expect((await answer(false)).get('cache-control')).toBeNull();
	});

	it('limits browser features and sniffing on every answer', async () => {
		for (const signedIn of [true, false]) {
			const headers = await answer(signedIn);
			expect(headers.get('permissions-policy')).toBe(PERMISSIONS_POLICY);
			expect(headers.get('x-content-type-options')).toBe('nosniff');
			expect(headers.get('referrer-policy')).toBe('same-origin');
		}
	});

	it('keeps a referrer policy an answer set itself', async () => {
		const own = new Response('x', { headers: { 'referrer-policy': 'no-referrer' } });
		expect((await answer(false, own)).get('referrer-policy')).toBe('no-referrer');
	});
});
