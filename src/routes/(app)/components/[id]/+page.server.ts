import { error, fail } from '@sveltejs/kit';
import { requireActor, requirePermission } from '$lib/server/guard';
import {
	checkComponentText,
	componentForm,
	componentText
} from '$lib/server/components/component-form';
import {
	findComponent,
	listComponents,
	molarMassOfComponent,
	updateComponent
} from '$lib/server/components/library';
import { formValues, parseForm, revisionField } from '$lib/server/forms';
import { RuleError } from '$lib/server/rule-error';
import { listRecipes } from '$lib/server/recipes/queries';
import type { Actions, PageServerLoad } from './$types';
import { may } from '$lib/permissions';

export const load: PageServerLoad = async ({ params, url }) => {
	const user = requirePermission('component.view');
	const component = findComponent(params.id);
	if (!component) error(404, { message: 'No component with this id.' });
	const basis = component.basisComponentId ? findComponent(component.basisComponentId) : undefined;
	return {
		component,
		molarMassGPerMol: molarMassOfComponent(component),
		basis: basis ? { id: basis.id, name: basis.name } : null,
		forms: listComponents()
			.filter((c) => c.basisComponentId === component.id)
			.map((c) => ({ id: c.id, name: c.name })),
		usedIn: listRecipes({ componentId: component.id, page: 1, pageSize: 50 }).rows.map((r) => ({
			id: r.id,
			name: r.name
		})),
		values: componentText(component) as Record<string, string>,
		basisChoices: listComponents()
			.filter((c) => !c.basisComponentId && c.id !== component.id)
			.map((c) => ({ id: c.id, name: c.name })),
		canEdit: may(user, 'component.edit'),
		created: url.searchParams.has('created')
	};
};

export const actions: Actions = {
	save: async ({ request, params }) => {
		const actor = requireActor('component.edit');
		const formData = await request.formData();
		const parsed = parseForm(
			componentForm.extend({ revision: revisionField }),
			formData,
			[],
			'Nothing was saved: correct the fields marked below.'
		);
		if (!parsed.ok) return parsed.failure;
		const { revision, ...input } = parsed.data;
		const checked = checkComponentText(input, { selfId: params.id });
		if (!checked.ok) {
			return fail(400, {
				message: 'Nothing was saved: correct the fields marked below.',
				fieldErrors: checked.fieldErrors,
				values: formValues(formData)
			});
		}
		try {
			updateComponent(actor, params.id, revision, checked.value);
		} catch (cause) {
			if (!(cause instanceof RuleError)) throw cause;
			return fail(cause.status, {
				message: cause.message,
				fieldErrors: {} as Record<string, string[]>,
				values: formValues(formData)
			});
		}
		return { saved: 'Saved.' };
	}
};
