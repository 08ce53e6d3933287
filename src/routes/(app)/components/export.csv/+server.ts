import { exportComponentsCsv } from '$lib/server/components/csv';
import { csvDownload } from '$lib/server/csv';
import { requireUser } from '$lib/server/guard';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async () => {
	requireUser();
	return csvDownload(exportComponentsCsv(), `components-${new Date().toISOString().slice(0, 10)}.csv`);
};
