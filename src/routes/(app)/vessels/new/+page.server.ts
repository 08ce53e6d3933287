import { redirect } from '@sveltejs/kit';
import { requireStudyAccess } from '$lib/server/studies/access';
import { submitVessel } from '$lib/server/studies/vessel-page';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireStudyAccess();
	return { values: { kLaMode: 'entered', temperatureC: '37', maxPressureKPa: '200', maxGasFlowVvm: '1' } as Record<string, string> };
};

export const actions: Actions = {
	save: async ({ request }) => {
		const actor = requireStudyAccess();
		const result = submitVessel(actor, await request.formData(), null);
		if ('failure' in result) return result.failure;
		redirect(303, `/vessels/${result.id}?saved=1`);
	}
};
