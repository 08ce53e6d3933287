import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { auditEventsFor } from '$lib/server/audit';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { changeRoles, findUser, rolesOf, setActive } from '$lib/server/people';
import { rolesField } from '$lib/server/role-field';
import type { Actions, PageServerLoad } from './$types';

const rolesForm = z.object({ roles: rolesField });
const confirmForm = z.object({ confirm: z.literal('yes', { error: 'Confirm first.' }) });

export const load: PageServerLoad = async ({ params }) => {
	requirePermission('admin.people');
	const person = findUser(params.id);
	if (!person) error(404, { message: 'No person with this id.' });
	return {
		person: {
			id: person.id,
			name: person.name,
			email: person.email,
			active: person.active,
			createdAt: person.createdAt,
			deactivatedAt: person.deactivatedAt,
			roles: rolesOf(person.id)
		},
		history: auditEventsFor('user', person.id)
	};
};

function actor() {
	const admin = requirePermission('admin.people');
	return { id: admin.id, email: admin.email, address: clientAddress() };
}

export const actions: Actions = {
	roles: async ({ request, params }) => {
		const by = actor();
		const formData = await request.formData();
		const parsed = parseForm(rolesForm, formData, ['roles']);
		if (!parsed.ok) return parsed.failure;
		try {
			changeRoles(by, params.id, parsed.data.roles);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		return { saved: 'Roles saved.' };
	},
	deactivate: async ({ request, params }) => {
		const by = actor();
		const formData = await request.formData();
		const confirmed = parseForm(
			confirmForm,
			formData,
			[],
			'Tick the box to confirm: their sessions end at once.'
		);
		if (!confirmed.ok) return confirmed.failure;
		try {
			await setActive(by, params.id, false);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		return { saved: 'Deactivated. Their sessions have ended.' };
	},
	reactivate: async ({ request, params }) => {
		const by = actor();
		const formData = await request.formData();
		try {
			await setActive(by, params.id, true);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		return { saved: 'Reactivated. They can sign in again.' };
	}
};
