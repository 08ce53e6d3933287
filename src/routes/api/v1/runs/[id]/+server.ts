import { endpoint } from '$lib/server/api/endpoint';
import { findRun } from '$lib/server/runs/run-data';
import { runAnswer } from '$lib/server/runs/run-api';

export const GET = endpoint({ act: 'run.view' }, ({ event }) =>
	runAnswer(findRun(event.params.id!).id)
);
