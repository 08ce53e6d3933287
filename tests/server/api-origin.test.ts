// JSON writes from another site's page are refused; this site and non-browser clients (no Origin)
// may write.
import type { RequestHandler } from '@sveltejs/kit';
import { describe, expect, it, vi } from 'vitest';
import { POST } from '../../src/routes/api/v1/formula/+server';
import { enterEvent } from './endpoint-call';
import { makeUser } from './helpers';

vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

function post(handler: RequestHandler, user: unknown, origin?: string) {
	const request = new Request('http://127.0.0.1/api/v1/formula', {
		method: 'POST',
		headers: { 'content-type': 'application/json', ...(origin ? { origin } : {}) },
		body: JSON.stringify({ formula: 'NaCl' })
	});
	return Promise.resolve(handler(enterEvent(request, { user })));
}

describe('origin checks on JSON writes', () => {
	it('refuses another origin, accepts this one and a client that sends none', async () => {
		const person = await makeUser(['engineer']);
		const foreign = await post(POST, person, 'https://elsewhere.example');
		expect(foreign.status).toBe(403);
		expect((await foreign.json()).detail).toMatch(
			/Writes from https:\/\/elsewhere\.example are not accepted/
		);
		expect((await post(POST, person, 'http://127.0.0.1')).status).toBe(200);
		expect((await post(POST, person)).status).toBe(200);
	});
});
