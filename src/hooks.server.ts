import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { building, dev } from '$app/environment';
import { sequence } from '@sveltejs/kit/hooks';
import { PROBLEM_CONTENT_TYPE, problem } from '$lib/server/api/problem';
import {
	deleteSessionCookie,
	invalidateSession,
	SESSION_COOKIE_NAME,
	setSessionCookie,
	validateSessionToken
} from '$lib/server/auth/sessions';
import { rolesOf } from '$lib/server/people';
import { handleBearerTokens } from '$lib/server/auth/bearer';
import { handleMalformedBodies } from '$lib/server/request-body-check';
import { handleCompression } from '$lib/server/compression';
import { handleHardeningHeaders } from '$lib/server/security-headers';
import { applySiteDecimalMark } from '$lib/server/site-decimal-mark';

/**
 * Runs once before the server answers its first request (`node build`, `npm start`): migrations, the
 * reference library, the demo, the mail stand-in and the digest timer. `vite dev` opens the database on
 * first use and starts no mail stand-in; the build step starts nothing.
 */
export const init: ServerInit = async () => {
	if (dev || building) return;
	const { startServer } = await import('$lib/server/start-up');
	await startServer();
};

/** Typed and imported numbers are read by the site's decimal mark as it is now (src/lib/number-reading.ts). */
const handleDecimalMark: Handle = async ({ event, resolve }) => {
	if (!building) applySiteDecimalMark();
	return resolve(event);
};

const handleSession: Handle = async ({ event, resolve }) => {
	if (event.locals.apiToken) return resolve(event);
	const token = event.cookies.get(SESSION_COOKIE_NAME);
	event.locals.user = null;
	event.locals.session = null;
	if (!token) return resolve(event);

	const validated = validateSessionToken(token);
	if (validated?.user.active) {
		const { session, user, fresh } = validated;
		// A fresh session was just extended: send the renewed cookie so it outlives inactivity only.
		if (fresh) setSessionCookie(event.cookies, token, session.expiresAt);
		event.locals.session = session;
		event.locals.user = {
			id: user.id,
			email: user.email,
			name: user.name,
			roles: rolesOf(user.id)
		};
	} else {
		if (validated) invalidateSession(validated.session.id);
		deleteSessionCookie(event.cookies);
	}
	return resolve(event);
};

/** Every error under /api is problem+json, including the ones the framework itself answers (404, 405). */
const handleApiProblems: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (!event.url.pathname.startsWith('/api/') || response.status < 400) return response;
	const type = response.headers.get('content-type') ?? '';
	if (type.startsWith(PROBLEM_CONTENT_TYPE)) return response;
	let detail = response.statusText || 'The request could not be served.';
	if (type.includes('json')) {
		const body = (await response.json().catch(() => ({}))) as { message?: string };
		if (body.message) detail = body.message;
	}
	if (response.status === 404 && detail === 'Not Found')
		detail = `No endpoint at ${event.url.pathname}.`;
	return problem(response.status, detail);
};

const handleSecurityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	response.headers.set('x-content-type-options', 'nosniff');
	response.headers.set('referrer-policy', 'same-origin');
	response.headers.set('x-frame-options', 'DENY');
	return response;
};

export const handle = sequence(
	handleCompression,
	handleHardeningHeaders,
	handleSecurityHeaders,
	handleDecimalMark,
	handleBearerTokens,
	handleSession,
	handleApiProblems,
	handleMalformedBodies
);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const errorId = crypto.randomUUID().slice(0, 8);
	if (status !== 404) {
		console.error(`[${errorId}] ${event.request.method} ${event.url.pathname}`, error);
	}
	return {
		message:
			status === 404
				? 'There is nothing at this address.'
				: `Something went wrong on our side (${message}). Quote reference ${errorId} when you report it.`,
		errorId
	};
};
