import { csvDownload } from '$lib/server/csv';
import { requirePermission } from '$lib/server/guard';
import { exportLotsCsv } from '$lib/server/inventory/csv';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async () => {
	requirePermission('lot.view');
	return csvDownload(exportLotsCsv(), `lots-${new Date().toISOString().slice(0, 10)}.csv`);
};
