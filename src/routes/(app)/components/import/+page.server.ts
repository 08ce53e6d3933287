import { requireComponentEditor } from '$lib/server/components/access';
import { importComponentCsv, previewComponentCsv } from '$lib/server/components/csv';
import { confirmStep, previewStep } from '$lib/server/csv-actions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireComponentEditor();
	return {};
};

export const actions: Actions = {
	preview: async ({ request }) => {
		requireComponentEditor();
		return previewStep(await request.formData(), previewComponentCsv);
	},
	confirm: async ({ request }) => {
		const actor = requireComponentEditor();
		return confirmStep(
			await request.formData(),
			(text) => importComponentCsv(actor, text),
			(count) => `${count} component${count === 1 ? '' : 's'} added to the library.`
		);
	}
};
