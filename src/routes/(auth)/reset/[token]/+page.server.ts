import { z } from 'zod';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { mismatch, newPasswordFields, passwordsMatch } from '$lib/server/password-form';
import { completePasswordReset, inspectPasswordReset, LINK_MESSAGES } from '$lib/server/people';
import type { Actions, PageServerLoad } from './$types';

const resetForm = z.object(newPasswordFields).refine(passwordsMatch, mismatch);

// Public by design: the secret link is the credential, checked here and again in the action.
export const load: PageServerLoad = async ({ params }) => {
	requirePermission('session.start');
	const { state } = inspectPasswordReset(params.token);
	return { state, message: state === 'valid' ? null : LINK_MESSAGES[state] };
};

export const actions: Actions = {
	default: async ({ request, params }) => {
		requirePermission('session.start');
		const formData = await request.formData();
		const parsed = parseForm(resetForm, formData);
		if (!parsed.ok) return parsed.failure;
		try {
			await completePasswordReset(params.token, parsed.data.password, clientAddress());
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		return { done: true };
	}
};
