import QRCode from 'qrcode';
import { batchViewOr404 } from '$lib/server/batches/load';
import { requirePermission } from '$lib/server/guard';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requirePermission('batch.view');
	const view = batchViewOr404(params.id);
	return {
		...view,
		qrPng: await QRCode.toDataURL(view.recordUrl, {
			margin: 2,
			width: 240,
			errorCorrectionLevel: 'M'
		})
	};
};
