// The stale-edit rule over HTTP: a record's ETag is its revision; an update names the revision it
// started from in If-Match, exactly as a page's form carries it in a hidden field.
import type { RequestEvent } from '@sveltejs/kit';
import { ApiProblem } from './endpoint';

/** A strong entity tag for a record at this revision. */
export function etagOf(revision: number): string {
	return `"${revision}"`;
}

/** The answer for a record, with its ETag so the caller can send it back in If-Match. */
export function withEtag(body: unknown, revision: number, status = 200): Response {
	return new Response(JSON.stringify(body), {
		status,
		headers: { 'content-type': 'application/json', etag: etagOf(revision) }
	});
}

/**
 * The revision an update was based on, read from If-Match. Missing: 428, so a script cannot
 * overwrite someone's change blindly; unreadable or not the current revision: 412.
 */
export function revisionFromIfMatch(event: RequestEvent, currentRevision: number): number {
	const header = event.request.headers.get('if-match');
	if (header === null)
		throw new ApiProblem(
			428,
			'Send If-Match with the ETag of the record you changed (GET it first): an update without it could overwrite someone else’s change.'
		);
	const tags = header.split(',').map((t) => t.trim().replace(/^W\//, ''));
	if (tags.includes('*')) return currentRevision;
	const match = tags.map((t) => /^"(\d+)"$/.exec(t)).find((m) => m !== null);
	if (!match)
		throw new ApiProblem(
			412,
			`If-Match ${header} is not an ETag this API gave: send the ETag header of the record as GET answered it.`
		);
	const revision = Number(match[1]);
	if (!tags.includes(etagOf(currentRevision)))
		throw new ApiProblem(
			412,
			`Someone else saved this record meanwhile: it is at ${etagOf(currentRevision)}, your change was made on ${header}. GET it again, apply your change and send it with the new ETag.`
		);
	return revision;
}
