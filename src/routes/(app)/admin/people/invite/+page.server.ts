import { z } from 'zod';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { invitePerson } from '$lib/server/people';
import { rolesField } from '$lib/server/role-field';
import type { Actions, PageServerLoad } from './$types';

const inviteForm = z.object({
	email: z.email('Enter an e-mail address such as name@site.example.').max(254),
	name: z.string().trim().max(120).default(''),
	roles: rolesField
});

export const load: PageServerLoad = async () => {
	requirePermission('admin.people');
	return {};
};

export const actions: Actions = {
	default: async ({ request }) => {
		const admin = requirePermission('admin.people');
		const formData = await request.formData();
		const parsed = parseForm(inviteForm, formData, ['roles']);
		if (!parsed.ok) return parsed.failure;
		try {
			const outcome = await invitePerson(
				{ id: admin.id, email: admin.email, name: admin.name, address: clientAddress() },
				parsed.data
			);
			return {
				invited: parsed.data.email,
				mailError: outcome.mailError,
				link: outcome.mailError ? outcome.link : undefined
			};
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
	}
};
