import { redirect } from '@sveltejs/kit';
import { isoToday } from '$lib/inventory';
import { listComponents } from '$lib/server/components/library';
import { formFailure, ruleFailure, formText, parseForm } from '$lib/server/forms';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { checkCertificateFiles } from '$lib/server/inventory/certificates';
import { checkLotInput, LOT_FIELDS } from '$lib/server/inventory/lot-input';
import { receiveLot } from '$lib/server/inventory/lots';
import { RuleError } from '$lib/server/rule-error';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';

// Shapes only: checkLotInput says what each value must hold; certificate files are read apart.
const lotForm = z.object(
	Object.fromEntries(LOT_FIELDS.map((f) => [f, formText])) as Record<
		(typeof LOT_FIELDS)[number],
		typeof formText
	>
);

export const load: PageServerLoad = async () => {
	requirePermission('lot.receive');
	return {
		components: listComponents().map((c) => ({
			id: c.id,
			name: c.name,
			storage: c.storage,
			densityGPerMl: c.densityGPerMl
		})),
		today: isoToday()
	};
};

export const actions: Actions = {
	default: async ({ request }) => {
		const user = requirePermission('lot.receive');
		const formData = await request.formData();
		const parsed = parseForm(lotForm, formData);
		if (!parsed.ok) return parsed.failure;
		const checked = checkLotInput(parsed.data);
		let uploads;
		try {
			uploads = await checkCertificateFiles(formData);
		} catch (cause) {
			if (!(cause instanceof RuleError)) throw cause;
			const fieldErrors = checked.ok ? {} : checked.fieldErrors;
			return formFailure(
				formData,
				`${cause.message} Choose the file again; everything else you typed is kept.`,
				{ ...fieldErrors, certificates: [cause.message] }
			);
		}
		if (!checked.ok) {
			const count = Object.keys(checked.fieldErrors).length;
			return formFailure(
				formData,
				`Please correct ${count === 1 ? 'the field' : `${count} fields`} marked below; nothing was received.${uploads.length ? ' Choose the certificate files again.' : ''}`,
				checked.fieldErrors
			);
		}
		let id: string;
		try {
			id = receiveLot(
				{ id: user.id, email: user.email, address: clientAddress() },
				checked.value,
				uploads
			).id;
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, `/lots/${id}?received=1`);
	}
};
