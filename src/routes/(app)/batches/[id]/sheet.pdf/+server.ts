import { batchViewOr404 } from '$lib/server/batches/load';
import { buildBatchSheetPdf } from '$lib/server/batches/pdf';
import { requirePermission } from '$lib/server/guard';
import { siteTimeZone } from '$lib/server/site-time-zone';
import { contentDisposition } from '$lib/server/inventory/certificates';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ params }) => {
	requirePermission('batch.view');
	const view = batchViewOr404(params.id);
	const pdf = await buildBatchSheetPdf(view, siteTimeZone());
	return new Response(new Uint8Array(pdf), {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': contentDisposition(`batch-sheet-${view.batch.number}.pdf`),
			'cache-control': 'private, no-store'
		}
	});
};
