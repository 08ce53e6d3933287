import { z } from 'zod';
import { changeOwnPassword } from '$lib/server/auth/change-password';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { mismatch, newPasswordFields, passwordsMatch } from '$lib/server/password-form';
import { findUser } from '$lib/server/people';
import type { Actions, PageServerLoad } from './$types';

const changeForm = z
	.object({ currentPassword: z.string().max(256), ...newPasswordFields })
	.refine(passwordsMatch, mismatch);

export const load: PageServerLoad = async () => {
	requirePermission('account.password');
	return {};
};

export const actions: Actions = {
	default: async ({ request, locals }) => {
		const person = requirePermission('account.password');
		const formData = await request.formData();
		const parsed = parseForm(changeForm, formData);
		if (!parsed.ok) return parsed.failure;
		try {
			const { sessionsEnded } = await changeOwnPassword(
				findUser(person.id)!,
				{ currentPassword: parsed.data.currentPassword, newPassword: parsed.data.password },
				{ sessionId: locals.session!.id, address: clientAddress() }
			);
			return { changed: true, sessionsEnded };
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
	}
};
