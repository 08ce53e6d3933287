import { json } from '@sveltejs/kit';
import { ApiProblem, endpoint } from '$lib/server/api/endpoint';
import { lotCreateRequest, lotFilterOf, lotListQuery } from '$lib/server/api/operations/inventory';
import { parseQuery } from '$lib/server/api/query';
import { clientAddress } from '$lib/server/guard';
import { checkLotInput } from '$lib/server/inventory/lot-input';
import { listLotsByCursor } from '$lib/server/inventory/lot-list';
import { receiveLot } from '$lib/server/inventory/lots';

export const GET = endpoint({ act: 'lot.view' }, ({ event }) => {
	const query = parseQuery(lotListQuery, event.url);
	return listLotsByCursor(lotFilterOf(query), query);
});

export const POST = endpoint({ act: 'lot.receive', body: lotCreateRequest }, ({ user, body }) => {
	const checked = checkLotInput(body);
	if (!checked.ok) {
		const errors = Object.entries(checked.fieldErrors).flatMap(([path, messages]) =>
			messages.map((message) => ({ path, message }))
		);
		throw new ApiProblem(
			400,
			`The lot has ${errors.length} problem${errors.length === 1 ? '' : 's'}: ${errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`,
			errors
		);
	}
	const lot = receiveLot(
		{ id: user!.id, email: user!.email, address: clientAddress() },
		checked.value
	);
	return json(lot, { status: 201, headers: { location: `/api/v1/lots/${lot.id}` } });
});
