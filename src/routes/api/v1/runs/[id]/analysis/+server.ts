import { endpoint } from '$lib/server/api/endpoint';
import { findRun } from '$lib/server/runs/run-data';
import { analyseRun } from '$lib/server/runs/run-analysis';

export const GET = endpoint({ act: 'run.view' }, async ({ event }) => {
	const found = findRun(event.params.id!);
	const { report: _report, ...analysis } = await analyseRun(found);
	return analysis;
});
