import { json } from '@sveltejs/kit';
import {
	batchCreateRequest,
	batchFilterOf,
	batchListQuery
} from '$lib/server/api/operations/batches';
import { ApiProblem, endpoint } from '$lib/server/api/endpoint';
import { parseQuery } from '$lib/server/api/query';
import { checkBatchInput, createBatch } from '$lib/server/batches/create';
import { listBatchesByCursor } from '$lib/server/batches/batch-list';
import { clientAddress } from '$lib/server/guard';

export const GET = endpoint({ act: 'batch.view' }, ({ event }) => {
	const query = parseQuery(batchListQuery, event.url);
	return listBatchesByCursor(batchFilterOf(query), query);
});

export const POST = endpoint({ act: 'batch.plan', body: batchCreateRequest }, ({ user, body }) => {
	const checked = checkBatchInput(body);
	if (!checked.ok) {
		const errors = Object.entries(checked.fieldErrors).flatMap(([path, messages]) =>
			messages.map((message) => ({ path, message }))
		);
		throw new ApiProblem(
			400,
			`The batch has ${errors.length} problem${errors.length === 1 ? '' : 's'}: ${errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`,
			errors
		);
	}
	const created = createBatch(
		{ id: user!.id, email: user!.email, address: clientAddress() },
		checked.value
	);
	return json(created, { status: 201, headers: { location: `/api/v1/batches/${created.id}` } });
});
