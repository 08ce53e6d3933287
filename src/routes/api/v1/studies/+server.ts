import { endpoint } from '$lib/server/api/endpoint';
import { studyListQuery } from '$lib/server/api/operations/studies';
import { parseQuery } from '$lib/server/api/query';
import { listStudiesByCursor } from '$lib/server/studies/study-list';
import { studyRequest } from '$lib/server/api/operations/study-writes';
import { actorOf } from '$lib/server/guard';
import { createStudyFromApi, studyAnswer } from '$lib/server/studies/study-api';

export const GET = endpoint({ act: 'study.use' }, ({ event }) => {
	const query = parseQuery(studyListQuery, event.url);
	return listStudiesByCursor(query.q, query);
});

export const POST = endpoint({ act: 'study.use', body: studyRequest }, async ({ user, body }) => {
	const id = await createStudyFromApi(actorOf(user!), body);
	return studyAnswer(id, true);
});
