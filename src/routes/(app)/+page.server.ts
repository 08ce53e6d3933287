import { may } from '$lib/permissions';
import { requirePermission } from '$lib/server/guard';
import { inventoryAlertCounts } from '$lib/server/inventory/overview';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const user = requirePermission('workspace.view');
	return {
		user,
		welcome: url.searchParams.has('welcome'),
		inventoryAlerts: may(user, 'inventory.manage') ? inventoryAlertCounts() : null
	};
};
