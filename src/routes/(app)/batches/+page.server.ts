import { batchFilterOf, batchPageQuery } from '$lib/server/api/operations/batches';
import { listBatchesPage } from '$lib/server/batches/batch-list';
import { approvedRecipes } from '$lib/server/batches/view';
import { requirePermission } from '$lib/server/guard';
import { lenientQuery } from '$lib/server/list-paging';
import { listRecipes } from '$lib/server/recipes/queries';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('batch.view');
	const query = lenientQuery(batchPageQuery, url);
	const { rows, total } = listBatchesPage(batchFilterOf(query), query);
	return {
		filter: {
			state: query.state ?? '',
			recipe: query.recipe ?? '',
			from: query.from ?? '',
			to: query.to ?? '',
			q: query.q ?? ''
		},
		batches: rows,
		total,
		paging: { page: query.page, limit: query.limit, sort: query.sort, dir: query.dir },
		recipes: listRecipes({ page: 1, pageSize: 500 }).rows.map((r) => ({ id: r.id, name: r.name })),
		canPlan: approvedRecipes().length > 0
	};
};
