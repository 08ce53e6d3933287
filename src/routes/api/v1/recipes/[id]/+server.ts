import { endpoint } from '$lib/server/api/endpoint';
import { recipeView } from '$lib/server/recipes/view';

export const GET = endpoint({ act: 'recipe.view' }, ({ event }) => recipeView(event.params.id!));
