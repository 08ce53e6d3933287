import { csvStreamDownload } from '$lib/server/csv-export';
import { requirePermission } from '$lib/server/guard';
import { trailExport } from '$lib/server/trail/export-csv';
import { exportFileName, exportFilter } from '$lib/server/trail/export-load';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ url }) => {
	requirePermission('admin.audit');
	const { filter } = exportFilter(url);
	return csvStreamDownload(trailExport(filter, url.origin), exportFileName('csv'));
};
