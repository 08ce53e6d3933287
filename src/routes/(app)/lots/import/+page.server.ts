import { csvTextFrom } from '$lib/server/csv';
import { formFailure, ruleFailure, formText, parseForm } from '$lib/server/forms';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { importLotCsv, LOT_IMPORT_TEMPLATE, previewLotCsv } from '$lib/server/inventory/csv';
import { RuleError } from '$lib/server/rule-error';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';

const importForm = z.object({ csv: formText });

export const load: PageServerLoad = async () => {
	requirePermission('lot.receive');
	return { template: LOT_IMPORT_TEMPLATE };
};

export const actions: Actions = {
	preview: async ({ request }) => {
		requirePermission('lot.receive');
		const formData = await request.formData();
		let text: string;
		try {
			text = await csvTextFrom(formData);
			const preview = previewLotCsv(text);
			return {
				preview: {
					rows: preview.rows.map((r) => ({
						rowNumber: r.rowNumber,
						values: r.values,
						errors: r.errors
					})),
					valid: preview.valid,
					invalid: preview.invalid
				},
				csv: text
			};
		} catch (cause) {
			if (cause instanceof RuleError)
				return formFailure(formData, cause.message, { csv: [cause.message] });
			throw cause;
		}
	},
	import: async ({ request }) => {
		const user = requirePermission('lot.receive');
		const formData = await request.formData();
		const parsed = parseForm(importForm, formData);
		if (!parsed.ok) return parsed.failure;
		try {
			const count = importLotCsv(
				{ id: user.id, email: user.email, address: clientAddress() },
				parsed.data.csv
			);
			return { imported: count };
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
	}
};
