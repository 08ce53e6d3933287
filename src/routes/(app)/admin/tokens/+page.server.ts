import { tokensOfKind } from '$lib/server/auth/api-tokens';
import { tokenRow, revokeFromForm } from '$lib/server/auth/token-pages';
import {
	createServiceToken,
	MAX_REQUESTS_PER_MINUTE,
	SERVICE_ROLES,
	serviceTokenForm
} from '$lib/server/auth/token-requests';
import { scopesAllowedFor } from '$lib/server/auth/token-scope-choices';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { actorOf, requirePermission } from '$lib/server/guard';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('admin.tokens');
	return {
		serviceTokens: tokensOfKind('service').map(tokenRow),
		personalTokens: tokensOfKind('personal').map(tokenRow),
		roles: SERVICE_ROLES,
		/** every scope some working role set may give: the page narrows it to the roles ticked */
		scopeChoices: scopesAllowedFor(SERVICE_ROLES),
		maxRequestsPerMinute: MAX_REQUESTS_PER_MINUTE,
		now: new Date()
	};
};

export const actions: Actions = {
	create: async ({ request }) => {
		const admin = requirePermission('admin.tokens');
		const formData = await request.formData();
		const parsed = parseForm(serviceTokenForm, formData, ['scopes', 'roles']);
		if (!parsed.ok) return parsed.failure;
		try {
			const token = createServiceToken(actorOf(admin), parsed.data);
			return { created: { name: parsed.data.name, token } };
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
	},
	revoke: async ({ request }) => {
		const admin = requirePermission('admin.tokens');
		const formData = await request.formData();
		try {
			return { revoked: revokeFromForm(actorOf(admin), formData, null) };
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
	}
};
