import { error } from '@sveltejs/kit';
import { csvDownload } from '$lib/server/csv';
import { requirePermission } from '$lib/server/guard';
import { whereUsedCsv } from '$lib/server/inventory/csv';
import { findLot } from '$lib/server/inventory/lots';
import { batchesMadeFromLot } from '$lib/server/inventory/where-used';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ params }) => {
	requirePermission('lot.view');
	const lot = findLot(params.id);
	if (!lot) error(404, { message: 'No lot with this id.' });
	return csvDownload(
		whereUsedCsv(lot.code, batchesMadeFromLot(lot.id)),
		`where-used-${lot.code}.csv`
	);
};
