import { z } from 'zod';
import { BATCH_STATES } from '$lib/batches';
import { approvedRecipes, listBatches } from '$lib/server/batches/view';
import { requirePermission } from '$lib/server/guard';
import { listRecipes } from '$lib/server/recipes/queries';
import type { PageServerLoad } from './$types';

const date = z
	.string()
	.regex(/^\d{4}-\d{2}-\d{2}$/)
	.optional()
	.catch(undefined);
const filterQuery = z.object({
	state: z.enum(BATCH_STATES).optional().catch(undefined),
	recipe: z.string().max(80).optional().catch(undefined),
	from: date,
	to: date
});

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('batch.view');
	const filter = filterQuery.parse(
		Object.fromEntries([...url.searchParams].filter(([, v]) => v !== ''))
	);
	return {
		filter,
		batches: listBatches({
			state: filter.state,
			recipeId: filter.recipe,
			from: filter.from,
			to: filter.to
		}),
		recipes: listRecipes({ page: 1, pageSize: 500 }).rows.map((r) => ({ id: r.id, name: r.name })),
		canPlan: approvedRecipes().length > 0
	};
};
