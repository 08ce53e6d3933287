import { redirect } from '@sveltejs/kit';
import { batchFromScan } from '$lib/server/batches/execution';
import { formFailure } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guard';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('batch.view');
	return {};
};

export const actions: Actions = {
	default: async ({ request }) => {
		requirePermission('batch.view');
		const formData = await request.formData();
		const code = String(formData.get('code') ?? '');
		const found = batchFromScan(code);
		if (!found) {
			return formFailure(formData, code.trim() ? `“${code.trim().slice(0, 120)}” is not a batch sheet known here. Scan the QR code at the top of the sheet, or type the batch number.` : 'Scan the sheet or type the batch number.', { code: ['Not a batch.'] });
		}
		redirect(303, `/batches/${found.id}`);
	}
};
