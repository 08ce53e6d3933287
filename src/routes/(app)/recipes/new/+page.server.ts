import { redirect } from '@sveltejs/kit';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { recipeHeadSchema } from '$lib/server/recipes/draft-writes';
import { createRecipe } from '$lib/server/recipes/drafts';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('recipe.edit');
	return {};
};

export const actions: Actions = {
	default: async ({ request }) => {
		const user = requirePermission('recipe.edit');
		const formData = await request.formData();
		const parsed = parseForm(recipeHeadSchema, formData);
		if (!parsed.ok) return parsed.failure;
		let recipeId: string;
		try {
			recipeId = createRecipe(
				{ id: user.id, email: user.email, address: clientAddress() },
				parsed.data
			);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, `/recipes/${recipeId}/versions/1/edit`);
	}
};
