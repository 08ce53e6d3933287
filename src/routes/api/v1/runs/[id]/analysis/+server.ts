import { endpoint } from '$lib/server/api/endpoint';
import { findRun } from '$lib/server/runs/run-data';
import { analyseRunOnChange } from '$lib/server/runs/run-analysis';

export const GET = endpoint({ act: 'run.view' }, async ({ event }) => {
	const found = findRun(event.params.id!);
	const { report: _report, ...analysis } = await analyseRunOnChange(found);
	return analysis;
});
