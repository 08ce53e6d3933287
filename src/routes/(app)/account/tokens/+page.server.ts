import { config } from '$lib/server/config';
import { personalTokensOf } from '$lib/server/auth/api-tokens';
import { tokenRow, revokeFromForm } from '$lib/server/auth/token-pages';
import { createPersonalToken, personalTokenForm } from '$lib/server/auth/token-requests';
import { scopesAllowedFor } from '$lib/server/auth/token-scope-choices';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { actorOf, requirePermission } from '$lib/server/guard';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const person = requirePermission('account.tokens');
	return {
		tokens: personalTokensOf(person.id).map(tokenRow),
		scopeChoices: scopesAllowedFor(person.roles),
		limit: config.apiTokensPerPerson,
		requestsPerMinute: config.apiTokenRequestsPerMinute,
		now: new Date()
	};
};

export const actions: Actions = {
	create: async ({ request }) => {
		const person = requirePermission('account.tokens');
		const formData = await request.formData();
		const parsed = parseForm(personalTokenForm, formData, ['scopes']);
		if (!parsed.ok) return parsed.failure;
		try {
			const token = createPersonalToken(actorOf(person), parsed.data);
			return { created: { name: parsed.data.name, token } };
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
	},
	revoke: async ({ request }) => {
		const person = requirePermission('account.tokens');
		const formData = await request.formData();
		try {
			return { revoked: revokeFromForm(actorOf(person), formData, person.id) };
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
	}
};
