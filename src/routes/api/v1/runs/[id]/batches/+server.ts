import { endpoint } from '$lib/server/api/endpoint';
import { runBatchLinkRequest } from '$lib/server/api/operations/run-writes';
import { actorOf } from '$lib/server/guard';
import { readLinkBody, runAnswer } from '$lib/server/runs/run-api';
import { findRun } from '$lib/server/runs/run-data';
import { linkBatch } from '$lib/server/runs/run-store';

/** The run page's "Link batch": a released batch by its number or sheet code, as medium or feed. */
export const POST = endpoint(
	{ act: 'run.record', body: runBatchLinkRequest },
	({ event, user, body }) => {
		const run = findRun(event.params.id!);
		const link = readLinkBody(body);
		linkBatch(actorOf(user!), run.id, link.batchNumber, link.role);
		return runAnswer(run.id, 201);
	}
);
