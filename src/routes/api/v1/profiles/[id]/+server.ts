import { ApiProblem, endpoint } from '$lib/server/api/endpoint';
import { revisionFromIfMatch, withEtag } from '$lib/server/api/etag';
import { profileLabel, profileRequest } from '$lib/server/api/operations/profiles-vessels';
import { jsonObjectBody, readRecordBody } from '$lib/server/api/record-body';
import { actorOf } from '$lib/server/guard';
import { profileValues, saveProfile } from '$lib/server/studies/profile-store';
import { findProfile } from '$lib/server/studies/record-lists';

function profileOr404(id: string) {
	const row = findProfile(id);
	if (!row) throw new ApiProblem(404, 'No such organism profile.');
	return row;
}

export const GET = endpoint({ act: 'study.use' }, ({ event }) => {
	const row = profileOr404(event.params.id!);
	return withEtag(row, row.revision);
});

/** The profile page's save: its checks, then its store call with the revision If-Match names. */
export const PUT = endpoint({ act: 'study.use', body: jsonObjectBody }, ({ event, user, body }) => {
	const id = event.params.id!;
	const revision = revisionFromIfMatch(event, profileOr404(id).revision);
	const { element, ...form } = readRecordBody(profileRequest, body, profileLabel);
	saveProfile(actorOf(user!), id, revision, profileValues(form, element ?? {}));
	const row = profileOr404(id);
	return withEtag(row, row.revision);
});
