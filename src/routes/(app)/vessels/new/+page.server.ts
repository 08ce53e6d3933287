import { redirect } from '@sveltejs/kit';
import { requirePermission } from '$lib/server/guard';
import { submitVessel } from '$lib/server/studies/vessel-page';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('study.use');
	return {
		values: {
			kLaMode: 'entered',
			temperatureC: '37',
			maxPressureKPa: '200',
			maxGasFlowVvm: '1'
		} as Record<string, string>
	};
};

export const actions: Actions = {
	save: async ({ request }) => {
		const actor = requirePermission('study.use');
		const result = submitVessel(actor, await request.formData(), null);
		if ('failure' in result) return result.failure;
		redirect(303, `/vessels/${result.id}?saved=1`);
	}
};
