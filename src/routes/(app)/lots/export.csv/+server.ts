import { csvStreamDownload } from '$lib/server/csv-export';
import { requirePermission } from '$lib/server/guard';
import { lotsExport } from '$lib/server/inventory/csv';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async () => {
	requirePermission('lot.view');
	return csvStreamDownload(lotsExport(), `lots-${new Date().toISOString().slice(0, 10)}.csv`);
};
