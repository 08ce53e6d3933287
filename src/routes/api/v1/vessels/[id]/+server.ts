import { ApiProblem, endpoint } from '$lib/server/api/endpoint';
import { revisionFromIfMatch, withEtag } from '$lib/server/api/etag';
import { vesselLabel, vesselRequest } from '$lib/server/api/operations/profiles-vessels';
import { jsonObjectBody, readRecordBody } from '$lib/server/api/record-body';
import { actorOf } from '$lib/server/guard';
import { findVessel } from '$lib/server/studies/record-lists';
import { saveVessel } from '$lib/server/studies/vessel-store';

function vesselOr404(id: string) {
	const row = findVessel(id);
	if (!row) throw new ApiProblem(404, 'No such vessel.');
	return row;
}

export const GET = endpoint({ act: 'study.use' }, ({ event }) => {
	const row = vesselOr404(event.params.id!);
	return withEtag(row, row.revision);
});

/** The vessel page's save: its checks, then its store call with the revision If-Match names. */
export const PUT = endpoint({ act: 'study.use', body: jsonObjectBody }, ({ event, user, body }) => {
	const id = event.params.id!;
	const revision = revisionFromIfMatch(event, vesselOr404(id).revision);
	saveVessel(actorOf(user!), id, revision, readRecordBody(vesselRequest, body, vesselLabel));
	const row = vesselOr404(id);
	return withEtag(row, row.revision);
});
