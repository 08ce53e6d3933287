import { error, type Handle } from '@sveltejs/kit';
import { problem } from './api/problem';

const METHODS_WITH_BODY = new Set(['POST', 'PUT', 'PATCH']);

/** What is wrong with the body, by how its content type says to read it; null when it reads. */
async function bodyProblem(request: Request): Promise<string | null> {
	const type = (request.headers.get('content-type') ?? '').toLowerCase();
	try {
		if (type.startsWith('multipart/form-data')) {
			if (!/;\s*boundary=/.test(type))
				return 'The form was sent as multipart/form-data without a boundary; send it again from the page.';
			await request.clone().formData();
		} else if (type.startsWith('application/x-www-form-urlencoded')) {
			await request.clone().formData();
		} else if (/^application\/([\w.+-]+\+)?json/.test(type)) {
			await request.clone().json();
		}
		return null;
	} catch {
		return type.includes('json')
			? 'The request body is not valid JSON.'
			: 'The form data could not be read (it is malformed or was cut short); send it again from the page.';
	}
}

/**
 * A body that cannot be read is the client's mistake, so it gets a 400 with a reason (problem+json
 * under /api) before any action or endpoint sees it, instead of the framework's 500.
 */
export const handleMalformedBodies: Handle = async ({ event, resolve }) => {
	if (!METHODS_WITH_BODY.has(event.request.method)) return resolve(event);
	const detail = await bodyProblem(event.request);
	if (!detail) return resolve(event);
	if (event.url.pathname.startsWith('/api/')) return problem(400, detail);
	error(400, { message: detail });
};
