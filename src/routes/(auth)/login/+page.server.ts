import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { setSessionCookie } from '$lib/server/auth/sessions';
import { signIn } from '$lib/server/auth/sign-in';
import { formFailure, parseForm } from '$lib/server/forms';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { safeRedirectPath } from '$lib/safe-redirect';
import type { Actions, PageServerLoad } from './$types';

const signInForm = z.object({
	email: z.email('Enter an e-mail address such as name@site.example.').max(254),
	password: z.string().min(1, 'Enter your password.').max(256),
	next: z.string().optional()
});

/** Only same-site paths, so a crafted link cannot bounce a user elsewhere after sign-in. */
const safeNext = safeRedirectPath;

export const load: PageServerLoad = async ({ locals, url }) => {
	requirePermission('session.start');
	// The sign-in page is the one door that needs no role: it is where the guard sends people.
	if (locals.user) redirect(303, safeNext(url.searchParams.get('next')));
	return { next: safeNext(url.searchParams.get('next')) };
};

export const actions: Actions = {
	default: async ({ request, cookies }) => {
		requirePermission('session.start');
		const formData = await request.formData();
		const parsed = parseForm(signInForm, formData);
		if (!parsed.ok) return parsed.failure;
		const { email, password, next } = parsed.data;
		const outcome = await signIn(email, password, clientAddress());
		if (!outcome.ok) {
			const fieldErrors = outcome.field ? { [outcome.field]: [outcome.message] } : {};
			return formFailure(
				formData,
				outcome.message,
				fieldErrors,
				outcome.status === 429 ? 429 : 400
			);
		}
		setSessionCookie(cookies, outcome.issued.token, outcome.issued.session.expiresAt);
		redirect(303, safeNext(next));
	}
};
