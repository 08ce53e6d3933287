import { redirect } from '@sveltejs/kit';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guard';
import { loadStudyChoices } from '$lib/server/studies/form-data';
import { STUDY_FORM_DEFAULTS, studySchema } from '$lib/server/studies/study-form';
import { createStudy } from '$lib/server/studies/study-store';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('study.use');
	return {
		choices: loadStudyChoices(),
		values: { ...STUDY_FORM_DEFAULTS } as Record<string, string>
	};
};

export const actions: Actions = {
	save: async ({ request }) => {
		const actor = requirePermission('study.use');
		const formData = await request.formData();
		const parsed = parseForm(studySchema, formData);
		if (!parsed.ok) return parsed.failure;
		let id: string;
		try {
			id = await createStudy(actor, parsed.data);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, `/studies/${id}?created=1`);
	}
};
