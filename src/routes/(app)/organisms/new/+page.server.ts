import { redirect } from '@sveltejs/kit';
import { requirePermission } from '$lib/server/guard';
import { profileChoices, submitProfile } from '$lib/server/studies/profile-page';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('study.use');
	return {
		...profileChoices(),
		values: { group: 'bacterium', kind: 'elementalFractions' } as Record<string, string>
	};
};

export const actions: Actions = {
	save: async ({ request }) => {
		const actor = requirePermission('study.use');
		const result = submitProfile(actor, await request.formData(), null);
		if ('failure' in result) return result.failure;
		redirect(303, `/organisms/${result.id}?saved=1`);
	}
};
