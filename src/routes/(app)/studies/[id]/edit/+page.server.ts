import { error, redirect } from '@sveltejs/kit';
import { parseForm, ruleFailure, revisionField } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guard';
import { loadStudyChoices } from '$lib/server/studies/form-data';
import { studySchema } from '$lib/server/studies/study-form';
import { studyFormValues, updateStudy } from '$lib/server/studies/study-store';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requirePermission('study.use');
	const values = studyFormValues(params.id);
	if (!values) error(404, { message: 'No such study.' });
	return { choices: loadStudyChoices(), values, id: params.id };
};

export const actions: Actions = {
	save: async ({ request, params }) => {
		const actor = requirePermission('study.use');
		const formData = await request.formData();
		const revisionRead = parseForm(
			z.object({ revision: revisionField }),
			formData,
			[],
			'The form lost its revision; reload the page.'
		);
		if (!revisionRead.ok) return revisionRead.failure;
		const { revision } = revisionRead.data;
		const parsed = parseForm(studySchema, formData);
		if (!parsed.ok) return parsed.failure;
		try {
			await updateStudy(actor, params.id, revision, parsed.data);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, `/studies/${params.id}?saved=1`);
	}
};
