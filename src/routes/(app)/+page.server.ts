import { requireUser } from '$lib/server/guard';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const user = requireUser();
	return { user, welcome: url.searchParams.has('welcome') };
};
