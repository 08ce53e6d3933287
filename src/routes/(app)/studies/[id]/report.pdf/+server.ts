import { requirePermission } from '$lib/server/guard';
import { contentDisposition } from '$lib/server/inventory/certificates';
import { loadStudyReport } from '$lib/server/studies/page-load';
import { buildStudyReportPdf, toSafeFileName } from '$lib/server/studies/report-pdf';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ params }) => {
	requirePermission('study.use');
	const loaded = await loadStudyReport(params.id);
	const pdf = await buildStudyReportPdf(loaded);
	return new Response(new Uint8Array(pdf), {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': contentDisposition(`${toSafeFileName(loaded.study.name)}.pdf`),
			'cache-control': 'private, no-store'
		}
	});
};
