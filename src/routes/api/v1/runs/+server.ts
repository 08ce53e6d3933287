import { runListQuery } from '$lib/server/api/operations/runs';
import { endpoint } from '$lib/server/api/endpoint';
import { parseQuery } from '$lib/server/api/query';
import { listRunsByCursor } from '$lib/server/runs/run-list';
import { runCreateRequest } from '$lib/server/api/operations/run-writes';
import { actorOf } from '$lib/server/guard';
import { readRunBody, runAnswer } from '$lib/server/runs/run-api';
import { createRun } from '$lib/server/runs/run-store';

export const GET = endpoint({ act: 'run.view' }, ({ event }) => {
	const query = parseQuery(runListQuery, event.url);
	return listRunsByCursor(query.q, query);
});

export const POST = endpoint({ act: 'run.record', body: runCreateRequest }, ({ user, body }) => {
	const created = createRun(actorOf(user!), readRunBody(body));
	return runAnswer(created.id, 201);
});
