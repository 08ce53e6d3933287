import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { createSession, setSessionCookie } from '$lib/server/auth/sessions';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { mismatch, newPasswordFields, passwordsMatch } from '$lib/server/password-form';
import { acceptInvitation, inspectInvitation, LINK_MESSAGES } from '$lib/server/people';
import { describeRoles } from '$lib/roles';
import type { Actions, PageServerLoad } from './$types';

const acceptForm = z
	.object({ name: z.string().trim().min(1, 'Enter your name.').max(120), ...newPasswordFields })
	.refine(passwordsMatch, mismatch);

// Public by design: the secret link is the credential, checked here and again in the action.
export const load: PageServerLoad = async ({ params }) => {
	requirePermission('session.start');
	const { state, invitation } = inspectInvitation(params.token);
	if (state !== 'valid' || !invitation)
		return { state, message: LINK_MESSAGES[state as keyof typeof LINK_MESSAGES] };
	return {
		state,
		email: invitation.email,
		name: invitation.name,
		roles: describeRoles(invitation.roles),
		expiresAt: invitation.expiresAt.toISOString()
	};
};

export const actions: Actions = {
	default: async ({ request, params, cookies }) => {
		requirePermission('session.start');
		const formData = await request.formData();
		const parsed = parseForm(acceptForm, formData);
		if (!parsed.ok) return parsed.failure;
		let userId: string;
		try {
			userId = await acceptInvitation(params.token, { ...parsed.data, address: clientAddress() });
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		const { token, session } = createSession(userId);
		setSessionCookie(cookies, token, session.expiresAt);
		redirect(303, '/?welcome=1');
	}
};
