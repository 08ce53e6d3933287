import { z } from 'zod';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { requestPasswordReset } from '$lib/server/people';
import type { Actions, PageServerLoad } from './$types';

const requestForm = z.object({
	email: z.email('Enter an e-mail address such as name@site.example.').max(254)
});

// Public by design: people who cannot sign in ask for a link here.
export const load: PageServerLoad = async () => {
	requirePermission('session.start');
	return {};
};

export const actions: Actions = {
	default: async ({ request }) => {
		requirePermission('session.start');
		const formData = await request.formData();
		const parsed = parseForm(requestForm, formData);
		if (!parsed.ok) return parsed.failure;
		// The same answer for every address: it must not tell which ones have accounts. Only too
		// many requests from this network address are refused, which tells nothing about accounts.
		try {
			requestPasswordReset(parsed.data.email, clientAddress());
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		return { sent: true, email: parsed.data.email };
	}
};
