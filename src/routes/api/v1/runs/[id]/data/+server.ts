import { json } from '@sveltejs/kit';
import { runDataQuery } from '$lib/server/api/operations/runs';
import { endpoint } from '$lib/server/api/endpoint';
import { parseQuery } from '$lib/server/api/query';
import { clientAddress } from '$lib/server/guard';
import { addRunData, findRun, runDataCsv } from '$lib/server/runs/run-data';
import { readDataPage } from '$lib/server/runs/series-read';

export const GET = endpoint({ act: 'run.view' }, ({ event }) => {
	const found = findRun(event.params.id!);
	const query = parseQuery(runDataQuery, event.url);
	if (query.format === 'csv')
		return new Response(runDataCsv(found.id), {
			headers: {
				'content-type': 'text/csv; charset=utf-8',
				'content-disposition': `attachment; filename="${found.number}-data.csv"`
			}
		});
	const page = readDataPage(found.id, query.page, query.limit);
	return { ...page, page: query.page, limit: query.limit };
});

export const POST = endpoint({ act: 'run.record' }, async ({ event, user }) => {
	const outcome = await addRunData(
		{ id: user!.id, email: user!.email, address: clientAddress() },
		event.params.id!,
		event.request,
		event.url
	);
	return json(outcome, { status: 201 });
});
