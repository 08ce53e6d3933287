import { endpoint } from '$lib/server/api/endpoint';
import {
	vesselLabel,
	vesselListQuery,
	vesselRequest
} from '$lib/server/api/operations/profiles-vessels';
import { parseQuery } from '$lib/server/api/query';
import { createdRecord, jsonObjectBody, readRecordBody } from '$lib/server/api/record-body';
import { actorOf } from '$lib/server/guard';
import { findVessel, listVesselsAfter } from '$lib/server/studies/record-lists';
import { saveVessel } from '$lib/server/studies/vessel-store';

export const GET = endpoint({ act: 'study.use' }, ({ event }) =>
	listVesselsAfter(parseQuery(vesselListQuery, event.url))
);

/** The new-vessel page's checks and store call: see routes/(app)/vessels/new. */
export const POST = endpoint({ act: 'study.use', body: jsonObjectBody }, ({ user, body }) => {
	const form = readRecordBody(vesselRequest, body, vesselLabel);
	const id = saveVessel(actorOf(user!), null, null, form);
	const row = findVessel(id)!;
	return createdRecord(`/api/v1/vessels/${id}`, row, row.revision);
});
