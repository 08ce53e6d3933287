import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { RECIPE_KINDS } from '$lib/recipes';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { createRecipe } from '$lib/server/recipes/drafts';
import type { Actions, PageServerLoad } from './$types';

const newRecipeForm = z.object({
	name: z
		.string()
		.trim()
		.min(1, 'Give the recipe a name.')
		.max(120, 'Keep the name to 120 characters.'),
	kind: z.enum(RECIPE_KINDS, { error: 'Choose what kind of recipe this is.' })
});

export const load: PageServerLoad = async () => {
	requirePermission('recipe.edit');
	return {};
};

export const actions: Actions = {
	default: async ({ request }) => {
		const user = requirePermission('recipe.edit');
		const formData = await request.formData();
		const parsed = parseForm(newRecipeForm, formData);
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
