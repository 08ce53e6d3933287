import { runListQuery } from '$lib/server/api/operations/runs';
import { endpoint } from '$lib/server/api/endpoint';
import { parseQuery } from '$lib/server/api/query';
import { listRunsByCursor } from '$lib/server/runs/run-list';

export const GET = endpoint({ act: 'run.view' }, ({ event }) => {
	const query = parseQuery(runListQuery, event.url);
	return listRunsByCursor(query.q, query);
});
