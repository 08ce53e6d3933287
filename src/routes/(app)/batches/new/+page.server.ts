import { redirect } from '@sveltejs/kit';
import { isoToday } from '$lib/inventory';
import { checkBatchInput, createBatch } from '$lib/server/batches/create';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { approvedRecipes } from '$lib/server/batches/view';
import { formFailure, ruleFailure } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('batch.plan');
	return { recipes: approvedRecipes(), today: isoToday(), recipeId: url.searchParams.get('recipe') ?? '' };
};

export const actions: Actions = {
	default: async ({ request }) => {
		const user = requirePermission('batch.plan');
		const formData = await request.formData();
		const checked = checkBatchInput({
			recipeId: String(formData.get('recipeId') ?? ''),
			targetVolumeL: String(formData.get('targetVolumeL') ?? ''),
			plannedOn: String(formData.get('plannedOn') ?? ''),
			intendedUse: String(formData.get('intendedUse') ?? '')
		});
		if (!checked.ok) return formFailure(formData, 'Please correct the fields marked below; no batch was planned.', checked.fieldErrors);
		let id: string;
		try {
			id = createBatch({ id: user.id, email: user.email, address: clientAddress() }, checked.value).id;
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, `/batches/${id}`);
	}
};
