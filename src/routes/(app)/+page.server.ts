import { may } from '$lib/permissions';
import { requirePermission } from '$lib/server/guard';
import { inventoryAlertCounts } from '$lib/server/inventory/overview';
import { reviewQueueFor } from '$lib/server/recipes/review-queue';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const user = requirePermission('workspace.view');
	return {
		user,
		welcome: url.searchParams.has('welcome'),
		inventoryAlerts: may(user, 'inventory.manage') ? inventoryAlertCounts() : null,
		reviewQueue:
			may(user, 'recipe.sign') || may(user, 'recipe.edit') ? reviewQueueFor(user.id) : null
	};
};
