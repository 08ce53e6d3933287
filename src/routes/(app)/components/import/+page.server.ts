import { requireActor, requirePermission } from '$lib/server/guard';
import { importComponentCsv, previewComponentCsv } from '$lib/server/components/csv';
import { confirmStep, previewStep } from '$lib/server/csv-actions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('component.edit');
	return {};
};

export const actions: Actions = {
	preview: async ({ request }) => {
		requirePermission('component.edit');
		return previewStep(await request.formData(), previewComponentCsv);
	},
	confirm: async ({ request }) => {
		const actor = requireActor('component.edit');
		return confirmStep(
			await request.formData(),
			(text) => importComponentCsv(actor, text),
			(count) => `${count} component${count === 1 ? '' : 's'} added to the library.`
		);
	}
};
