import { lotFilterOf, lotPageQuery } from '$lib/server/api/operations/inventory';
import { listComponents } from '$lib/server/components/library';
import { requirePermission } from '$lib/server/guard';
import { listLotsPage } from '$lib/server/inventory/lot-list';
import { lenientQuery } from '$lib/server/list-paging';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('lot.view');
	const query = lenientQuery(lotPageQuery, url);
	const { rows, total } = listLotsPage(lotFilterOf(query), query);
	const components = listComponents().map((c) => ({ id: c.id, name: c.name }));
	return {
		lots: rows,
		total,
		paging: { page: query.page, limit: query.limit, sort: query.sort, dir: query.dir },
		components,
		filter: {
			component: query.component ?? '',
			status: query.status ?? '',
			expiringBefore: query.expiringBefore ?? '',
			q: query.q ?? ''
		}
	};
};
