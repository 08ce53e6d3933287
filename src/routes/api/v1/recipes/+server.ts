import { endpoint } from '$lib/server/api/endpoint';
import { recipeFilterOf, recipeListQuery } from '$lib/server/api/operations/recipes';
import { parseQuery } from '$lib/server/api/query';
import { listRecipesByCursor } from '$lib/server/recipes/queries';

export const GET = endpoint({ act: 'recipe.view' }, ({ event }) => {
	const query = parseQuery(recipeListQuery, event.url);
	return listRecipesByCursor(recipeFilterOf(query), query);
});
