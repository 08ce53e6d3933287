import { requirePermission } from '$lib/server/guard';
import { contentDisposition } from '$lib/server/inventory/certificates';
import { entriesToExport, exportFileName } from '$lib/server/trail/export-load';
import { buildTrailPdf } from '$lib/server/trail/export-pdf';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ url }) => {
	requirePermission('admin.audit');
	const { entries, summary } = entriesToExport(url);
	const pdf = await buildTrailPdf(entries, { filterSummary: summary });
	return new Response(new Uint8Array(pdf), {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': contentDisposition(exportFileName('pdf')),
			'cache-control': 'private, no-store'
		}
	});
};
