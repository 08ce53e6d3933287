import { studyPageQuery } from '$lib/server/api/operations/studies';
import { requirePermission } from '$lib/server/guard';
import { lenientQuery } from '$lib/server/list-paging';
import { listStudiesPage } from '$lib/server/studies/study-list';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('study.use');
	const query = lenientQuery(studyPageQuery, url);
	const { rows, total } = listStudiesPage(query.q, query);
	return {
		studies: rows,
		total,
		paging: { page: query.page, limit: query.limit, sort: query.sort, dir: query.dir },
		q: query.q ?? ''
	};
};
