import { error, json, type Handle } from '@sveltejs/kit';
import { problem } from './api/problem';

const METHODS_WITH_BODY = new Set(['POST', 'PUT', 'PATCH']);

const FORM_UNREADABLE =
	'The form data could not be read (it is malformed or was cut short); send it again from the page.';

/**
 * A urlencoded body's text decoded, or null when no form sends it. Its parser never fails:
 * `formData()` keeps a stray `%` as text and turns bytes that are not UTF-8 into U+FFFD, so
 * `%zz=%%&a=%E0%A4%A` reached actions as mangled fields (a settings checkbox read as unticked and
 * saved). Browsers escape every `%` and encode UTF-8, so `decodeURIComponent`, which throws on
 * both, reads every body a form sends. The result is returned, not dropped: the build takes
 * `decodeURIComponent` for pure and removed an unused call, and the throw with it.
 */
function decodedFormText(text: string): string | null {
	try {
		return decodeURIComponent(text);
	} catch {
		return null;
	}
}

/** What is wrong with the body, by how its content type says to read it; null when it reads. */
async function bodyProblem(request: Request): Promise<string | null> {
	const type = (request.headers.get('content-type') ?? '').toLowerCase();
	try {
		if (type.startsWith('multipart/form-data')) {
			if (!/;\s*boundary=/.test(type))
				return 'The form was sent as multipart/form-data without a boundary; send it again from the page.';
			await request.clone().formData();
		} else if (type.startsWith('application/x-www-form-urlencoded')) {
			if (decodedFormText(await request.clone().text()) === null) return FORM_UNREADABLE;
		} else if (/^application\/([\w.+-]+\+)?json/.test(type)) {
			await request.clone().json();
		}
		return null;
	} catch {
		return type.includes('json') ? 'The request body is not valid JSON.' : FORM_UNREADABLE;
	}
}

/**
 * A body that cannot be read is the client's mistake, so it gets a 400 with a reason (problem+json
 * under /api) before any action or endpoint sees it, instead of the framework's 500.
 */
export const handleMalformedBodies: Handle = async ({ event, resolve }) => {
	if (!METHODS_WITH_BODY.has(event.request.method)) return resolve(event);
	const api = event.url.pathname.startsWith('/api/');
	const detail = (api ? null : notAForm(event.request)) ?? (await bodyProblem(event.request));
	if (!detail) return resolve(event);
	if (api) return problem(400, detail);
	// A submit from `use:enhance` reads an action result; a plain post shows the error page.
	if (event.request.headers.get('x-sveltekit-action') === 'true')
		return json({ type: 'error', error: { message: detail } }, { status: 400 });
	error(400, { message: detail });
};

/**
 * Everything outside /api is a page, and a page takes only forms: any other body (text/plain,
 * JSON, none) would reach the action's `formData()` and fail there as a server error, or get the
 * framework's 415 that reads as our fault.
 */
function notAForm(request: Request): string | null {
	const type = (request.headers.get('content-type') ?? '').toLowerCase();
	if (
		type.startsWith('multipart/form-data') ||
		type.startsWith('application/x-www-form-urlencoded')
	)
		return null;
	return `This page takes a form sent from the page itself, not ${type ? type.split(';')[0] : 'a body without a content type'}; open the page and send the form again.`;
}
