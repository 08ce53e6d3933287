import { runPageQuery } from '$lib/server/api/operations/runs';
import { requirePermission } from '$lib/server/guard';
import { lenientQuery } from '$lib/server/list-paging';
import { listRunsPage } from '$lib/server/runs/run-list';
import { may } from '$lib/permissions';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const user = requirePermission('run.view');
	const query = lenientQuery(runPageQuery, url);
	const { rows, total } = listRunsPage(query.q, query);
	return {
		runs: rows,
		total,
		paging: { page: query.page, limit: query.limit, sort: query.sort, dir: query.dir },
		q: query.q ?? '',
		canRecord: may(user, 'run.record')
	};
};
