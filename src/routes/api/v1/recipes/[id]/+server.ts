import { endpoint } from '$lib/server/api/endpoint';
import { recipeView } from '$lib/server/recipes/view';

export const GET = endpoint({ access: { roles: [] } }, ({ event }) => recipeView(event.params.id!));
