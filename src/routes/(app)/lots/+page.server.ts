import { z } from 'zod';
import { LOT_STATUSES } from '$lib/inventory';
import { listComponents } from '$lib/server/components/library';
import { requirePermission } from '$lib/server/guard';
import { listLots } from '$lib/server/inventory/lots';
import type { PageServerLoad } from './$types';

const filterQuery = z.object({
	component: z.string().max(80).optional().catch(undefined),
	status: z.enum(LOT_STATUSES).optional().catch(undefined),
	expiringBefore: z
		.string()
		.regex(/^\d{4}-\d{2}-\d{2}$/)
		.optional()
		.catch(undefined)
});

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('lot.view');
	const filter = filterQuery.parse(
		Object.fromEntries([...url.searchParams].filter(([, v]) => v !== ''))
	);
	const lots = listLots({
		componentId: filter.component,
		status: filter.status,
		expiringBefore: filter.expiringBefore
	});
	const components = listComponents().map((c) => ({ id: c.id, name: c.name }));
	return { lots, components, filter };
};
