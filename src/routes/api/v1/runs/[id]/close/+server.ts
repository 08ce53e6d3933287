import { endpoint } from '$lib/server/api/endpoint';
import { revisionFromIfMatch } from '$lib/server/api/etag';
import { actorOf } from '$lib/server/guard';
import { runAnswer } from '$lib/server/runs/run-api';
import { findRun } from '$lib/server/runs/run-data';
import { setRunState } from '$lib/server/runs/run-store';

/** The run page's "End run". */
export const POST = endpoint({ act: 'run.record' }, ({ event, user }) => {
	const run = findRun(event.params.id!);
	revisionFromIfMatch(event, run.revision);
	setRunState(actorOf(user!), run.id, 'closed', '');
	return runAnswer(run.id);
});
