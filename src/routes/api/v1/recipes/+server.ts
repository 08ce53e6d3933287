import { endpoint } from '$lib/server/api/endpoint';
import { recipeListQuery } from '$lib/server/api/operations/recipes';
import { parseQuery } from '$lib/server/api/query';
import { listRecipes } from '$lib/server/recipes/queries';

export const GET = endpoint({ act: 'recipe.view' }, ({ event }) => {
	const query = parseQuery(recipeListQuery, event.url);
	const { rows, total } = listRecipes({
		kind: query.kind,
		status: query.status,
		componentId: query.component,
		search: query.q,
		page: query.page,
		pageSize: query.pageSize
	});
	return { items: rows, total, page: query.page, pageSize: query.pageSize };
});
