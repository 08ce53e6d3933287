import { endpoint } from '$lib/server/api/endpoint';
import { studyListQuery } from '$lib/server/api/operations/studies';
import { parseQuery } from '$lib/server/api/query';
import { listStudiesPage } from '$lib/server/studies/study-list';

export const GET = endpoint({ act: 'study.use' }, ({ event }) => {
	const query = parseQuery(studyListQuery, event.url);
	const { rows, total } = listStudiesPage(query.q, query);
	return { studies: rows, total, page: query.page, limit: query.limit };
});
