import { error, redirect } from '@sveltejs/kit';
import { ruleFailure, parseForm } from '$lib/server/forms';
import { requireActor, requirePermission } from '$lib/server/guard';
import { RuleError } from '$lib/server/rule-error';
import { startDraftFrom } from '$lib/server/recipes/drafts';
import { findRecipe } from '$lib/server/recipes/queries';
import { recipeView } from '$lib/server/recipes/view';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { may } from '$lib/permissions';

const newDraftForm = z.object({ versionId: z.string().default('') });

export const load: PageServerLoad = async ({ params }) => {
	const user = requirePermission('recipe.view');
	try {
		return { ...recipeView(params.id), canEdit: may(user, 'recipe.edit') };
	} catch (cause) {
		if (cause instanceof RuleError) error(cause.status, { message: cause.message });
		throw cause;
	}
};

export const actions: Actions = {
	newDraft: async ({ request, params }) => {
		const actor = requireActor('recipe.edit');
		const formData = await request.formData();
		if (!findRecipe(params.id)) error(404, { message: 'No recipe with this id.' });
		const parsed = parseForm(newDraftForm, formData);
		if (!parsed.ok) return parsed.failure;
		let n: number;
		try {
			n = startDraftFrom(actor, parsed.data.versionId).n;
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, `/recipes/${params.id}/versions/${n}/edit`);
	}
};
