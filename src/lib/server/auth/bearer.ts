import type { Handle } from '@sveltejs/kit';
import { problem } from '../api/problem';
import { checkBearer, TOKEN_LIKE } from './api-tokens';
import { takeTokenRequest } from './token-rate';

/** Query parameters scripts commonly carry a token in; on the API, any of them is refused. */
const TOKEN_PARAMETERS = new Set(['access_token', 'token', 'api_key', 'apikey', 'bearer', 'auth']);

/** The parameter that carries a token in the address, if any. */
function tokenInAddress(url: URL): string | null {
	const onApi = url.pathname.startsWith('/api/');
	for (const [name, value] of url.searchParams) {
		if (TOKEN_LIKE.test(value) || (onApi && TOKEN_PARAMETERS.has(name.toLowerCase()))) return name;
	}
	return null;
}

/** A header value carries only visible ASCII: curly quotes and arrows become plain ones or go. */
function headerText(detail: string): string {
	return detail
		.replace(/[“”"\\]/g, "'")
		.replace(/→/g, '>')
		.replace(/[^\x20-\x7e]/g, '');
}

function refusal(status: 400 | 401 | 429, detail: string, headers: Record<string, string> = {}) {
	return problem(status, detail, { headers: { 'cache-control': 'no-store', ...headers } });
}

/**
 * API requests may carry `Authorization: Bearer <token>` instead of the session cookie. The token
 * then decides who is asking (its person or service account) and, in the guard, which acts it may
 * do. A token in the address is refused: addresses end up in logs, proxies and browser history.
 */
export const handleBearerTokens: Handle = async ({ event, resolve }) => {
	event.locals.apiToken = null;
	const parameter = tokenInAddress(event.url);
	if (parameter !== null)
		return refusal(
			400,
			`A token in the address (the ${parameter} parameter) is refused: addresses are kept in logs and histories. Send it as the header Authorization: Bearer <token>, and if it was a real token, revoke it under Account → API tokens and make a new one.`
		);
	const header = event.request.headers.get('authorization');
	if (header === null || !event.url.pathname.startsWith('/api/')) return resolve(event);
	const check = checkBearer(header);
	if (!check.ok)
		return refusal(401, check.detail, {
			'www-authenticate': `Bearer error="invalid_token", error_description="${headerText(check.detail)}"`
		});
	const waitS = takeTokenRequest(check.token.id, check.token.requestsPerMinute);
	if (waitS !== null)
		return refusal(
			429,
			`This token (“${check.token.name}”) may make ${check.token.requestsPerMinute} requests a minute; try again in ${waitS} s.`,
			{ 'retry-after': String(waitS) }
		);
	event.locals.apiToken = check.token;
	event.locals.user = check.user;
	event.locals.session = null;
	return resolve(event);
};
