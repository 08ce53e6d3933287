import { z } from 'zod';
import {
	batchNumberPattern,
	formatBatchNumber,
	setBatchNumberPattern
} from '$lib/server/batches/numbering';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { clientAddress, requirePermission } from '$lib/server/guard';
import type { Actions, PageServerLoad } from './$types';

const patternForm = z.object({ pattern: z.string().max(60) });

export const load: PageServerLoad = async () => {
	requirePermission('admin.settings');
	const pattern = batchNumberPattern();
	return { pattern, example: formatBatchNumber(pattern, new Date(), 1) };
};

export const actions: Actions = {
	pattern: async ({ request }) => {
		const admin = requirePermission('admin.settings');
		const formData = await request.formData();
		const parsed = parseForm(patternForm, formData);
		if (!parsed.ok) return parsed.failure;
		try {
			setBatchNumberPattern(
				{ id: admin.id, email: admin.email, address: clientAddress() },
				parsed.data.pattern
			);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		return {
			saved: `Saved. The next batch number will look like ${formatBatchNumber(parsed.data.pattern.trim(), new Date(), 1)}.`
		};
	}
};
