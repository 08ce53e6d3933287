import { redirect } from '@sveltejs/kit';
import { signOut } from '$lib/server/auth/sign-in';
import { clientAddress, requirePermission } from '$lib/server/guard';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('session.end');
	redirect(303, '/');
};

export const actions: Actions = {
	default: async ({ locals, cookies }) => {
		const user = requirePermission('session.end');
		if (locals.session) {
			await signOut(cookies, locals.session.id, {
				id: user.id,
				email: user.email,
				address: clientAddress()
			});
		}
		redirect(303, '/login');
	}
};
