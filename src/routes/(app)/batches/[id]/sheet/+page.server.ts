import QRCode from 'qrcode';
import { batchViewOr404 } from '$lib/server/batches/load';
import { requirePermission } from '$lib/server/guard';
import { SHEET_COLUMNS, sheetRows, signatureRows } from '$lib/server/batches/sheet-table';
import { siteTimeZone } from '$lib/server/site-time-zone';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requirePermission('batch.view');
	const view = batchViewOr404(params.id);
	const timeZone = siteTimeZone();
	return {
		...view,
		columns: SHEET_COLUMNS,
		rows: sheetRows(view, timeZone),
		signatureRows: signatureRows(view, timeZone),
		qrPng: await QRCode.toDataURL(view.recordUrl, {
			margin: 2,
			width: 240,
			errorCorrectionLevel: 'M'
		})
	};
};
