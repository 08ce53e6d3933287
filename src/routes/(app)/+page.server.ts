import { requirePermission } from '$lib/server/guard';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const user = requirePermission('workspace.view');
	return { user, welcome: url.searchParams.has('welcome') };
};
