import { exportComponentsCsv } from '$lib/server/components/csv';
import { csvDownload } from '$lib/server/csv';
import { requirePermission } from '$lib/server/guard';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async () => {
	requirePermission('component.view');
	return csvDownload(
		exportComponentsCsv(),
		`components-${new Date().toISOString().slice(0, 10)}.csv`
	);
};
