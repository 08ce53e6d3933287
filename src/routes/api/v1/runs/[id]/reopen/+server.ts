import { endpoint } from '$lib/server/api/endpoint';
import { revisionFromIfMatch } from '$lib/server/api/etag';
import { runReopenRequest } from '$lib/server/api/operations/run-writes';
import { actorOf } from '$lib/server/guard';
import { runAnswer } from '$lib/server/runs/run-api';
import { findRun } from '$lib/server/runs/run-data';
import { setRunState } from '$lib/server/runs/run-store';

/** The run page's "Open again", with the reason. */
export const POST = endpoint(
	{ act: 'run.record', body: runReopenRequest },
	({ event, user, body }) => {
		const run = findRun(event.params.id!);
		revisionFromIfMatch(event, run.revision);
		setRunState(actorOf(user!), run.id, 'open', body.reason ?? '');
		return runAnswer(run.id);
	}
);
