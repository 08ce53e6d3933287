import { csvDownload } from '$lib/server/csv';
import { requirePermission } from '$lib/server/guard';
import { trailCsv } from '$lib/server/trail/export-csv';
import { entriesToExport, exportFileName } from '$lib/server/trail/export-load';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ url }) => {
	requirePermission('admin.audit');
	const { entries } = entriesToExport(url);
	return csvDownload(trailCsv(entries, url.origin), exportFileName('csv'));
};
