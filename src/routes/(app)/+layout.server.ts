import { requirePermission } from '$lib/server/guard';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async () => {
	const user = requirePermission('workspace.view');
	return { user };
};
