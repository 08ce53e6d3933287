import { runListQuery } from '$lib/server/api/operations/runs';
import { endpoint } from '$lib/server/api/endpoint';
import { parseQuery } from '$lib/server/api/query';
import { listRunsPage } from '$lib/server/runs/run-list';

export const GET = endpoint({ act: 'run.view' }, ({ event }) => {
	const query = parseQuery(runListQuery, event.url);
	const { rows, total } = listRunsPage(query.q, query);
	return { runs: rows, total, page: query.page, limit: query.limit };
});
