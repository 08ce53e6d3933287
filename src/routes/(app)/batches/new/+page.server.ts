import { redirect } from '@sveltejs/kit';
import { isoToday } from '$lib/inventory';
import { checkBatchInput, createBatch } from '$lib/server/batches/create';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { approvedRecipes } from '$lib/server/batches/view';
import { formFailure, ruleFailure, parseForm } from '$lib/server/forms';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';

// Shapes only: checkBatchInput says what each value must be, by the field's label.
const text = z.string().default('');
const planForm = z.object({
	recipeId: text,
	targetVolumeL: text,
	plannedOn: text,
	intendedUse: text
});

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('batch.plan');
	return {
		recipes: approvedRecipes(),
		today: isoToday(),
		recipeId: url.searchParams.get('recipe') ?? ''
	};
};

export const actions: Actions = {
	default: async ({ request }) => {
		const user = requirePermission('batch.plan');
		const formData = await request.formData();
		const parsed = parseForm(planForm, formData);
		if (!parsed.ok) return parsed.failure;
		const checked = checkBatchInput(parsed.data);
		if (!checked.ok)
			return formFailure(
				formData,
				'Please correct the fields marked below; no batch was planned.',
				checked.fieldErrors
			);
		let id: string;
		try {
			id = createBatch(
				{ id: user.id, email: user.email, address: clientAddress() },
				checked.value
			).id;
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, `/batches/${id}`);
	}
};
