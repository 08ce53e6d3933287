import { endpoint } from '$lib/server/api/endpoint';
import {
	profileLabel,
	profileListQuery,
	profileRequest
} from '$lib/server/api/operations/profiles-vessels';
import { parseQuery } from '$lib/server/api/query';
import { createdRecord, jsonObjectBody, readRecordBody } from '$lib/server/api/record-body';
import { actorOf } from '$lib/server/guard';
import { profileValues, saveProfile } from '$lib/server/studies/profile-store';
import { findProfile, listProfilesAfter } from '$lib/server/studies/record-lists';

export const GET = endpoint({ act: 'study.use' }, ({ event }) =>
	listProfilesAfter(parseQuery(profileListQuery, event.url))
);

/** The new-profile page's checks and store call: see routes/(app)/organisms/new. */
export const POST = endpoint({ act: 'study.use', body: jsonObjectBody }, ({ user, body }) => {
	const { element, ...form } = readRecordBody(profileRequest, body, profileLabel);
	const id = saveProfile(actorOf(user!), null, null, profileValues(form, element ?? {}));
	const row = findProfile(id)!;
	return createdRecord(`/api/v1/profiles/${id}`, row, row.revision);
});
