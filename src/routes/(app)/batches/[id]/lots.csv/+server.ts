import { error } from '@sveltejs/kit';
import { findBatch } from '$lib/server/batches/execution';
import { csvDownload } from '$lib/server/csv';
import { requirePermission } from '$lib/server/guard';
import { batchLotsCsv } from '$lib/server/inventory/csv';
import { lotsUsedByBatch } from '$lib/server/inventory/where-used';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ params }) => {
	requirePermission('batch.view');
	const b = findBatch(params.id);
	if (!b) error(404, { message: 'No batch with this id.' });
	return csvDownload(batchLotsCsv(b.number, lotsUsedByBatch(b.id)), `lots-used-${b.number}.csv`);
};
