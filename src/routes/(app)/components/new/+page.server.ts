import { fail, redirect } from '@sveltejs/kit';
import { requireActor, requirePermission } from '$lib/server/guard';
import {
	checkComponentText,
	componentText,
	componentForm
} from '$lib/server/components/component-form';
import { createComponent, listComponents } from '$lib/server/components/library';
import { formValues, parseForm } from '$lib/server/forms';
import { db } from '$lib/server/db';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('component.edit');
	return {
		values: componentText(undefined) as Record<string, string>,
		basisChoices: listComponents()
			.filter((c) => !c.basisComponentId)
			.map((c) => ({ id: c.id, name: c.name }))
	};
};

export const actions: Actions = {
	save: async ({ request }) => {
		const actor = requireActor('component.edit');
		const formData = await request.formData();
		const parsed = parseForm(
			componentForm,
			formData,
			[],
			'Nothing was saved: correct the fields marked below.'
		);
		if (!parsed.ok) return parsed.failure;
		const checked = checkComponentText(parsed.data);
		if (!checked.ok) {
			return fail(400, {
				message: 'Nothing was saved: correct the fields marked below.',
				fieldErrors: checked.fieldErrors,
				values: formValues(formData)
			});
		}
		const id = db.transaction((tx) => createComponent(actor, checked.value, tx));
		redirect(303, `/components/${id}?created=1`);
	}
};
