import { redirect } from '@sveltejs/kit';
import { listComponents } from '$lib/server/components/library';
import { formFailure, ruleFailure } from '$lib/server/forms';
import { requireStudyAccess } from '$lib/server/studies/access';
import { loadStudyReport } from '$lib/server/studies/page-load';
import { deleteStudy } from '$lib/server/studies/study-store';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requireStudyAccess();
	const loaded = loadStudyReport(params.id);
	const components = listComponents().map((c) => ({ id: c.id, name: c.name, category: c.category }));
	return { ...loaded, components };
};

export const actions: Actions = {
	delete: async ({ request, params }) => {
		const actor = requireStudyAccess();
		const formData = await request.formData();
		if (formData.get('confirm') !== 'yes') return formFailure(formData, 'Confirm the deletion first.');
		try {
			deleteStudy(actor, params.id);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, '/studies?deleted=1');
	}
};
