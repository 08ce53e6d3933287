import { endpoint } from '$lib/server/api/endpoint';
import { studyListQuery } from '$lib/server/api/operations/studies';
import { parseQuery } from '$lib/server/api/query';
import { listStudiesByCursor } from '$lib/server/studies/study-list';

export const GET = endpoint({ act: 'study.use' }, ({ event }) => {
	const query = parseQuery(studyListQuery, event.url);
	return listStudiesByCursor(query.q, query);
});
