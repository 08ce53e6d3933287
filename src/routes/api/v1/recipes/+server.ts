import { endpoint } from '$lib/server/api/endpoint';
import { recipeFilterOf, recipeListQuery } from '$lib/server/api/operations/recipes';
import { parseQuery } from '$lib/server/api/query';
import { listRecipesByCursor } from '$lib/server/recipes/queries';
import { recipeCreateRequest } from '$lib/server/api/operations/recipe-writes';
import { actorOf } from '$lib/server/recipes/access';
import { createRecipeWithDraft } from '$lib/server/recipes/draft-writes';
import {
	draftFieldsOf,
	draftLinesOf,
	orRefused,
	versionAnswer,
	versionLocation
} from '$lib/server/recipes/version-api';

export const GET = endpoint({ act: 'recipe.view' }, ({ event }) => {
	const query = parseQuery(recipeListQuery, event.url);
	return listRecipesByCursor(recipeFilterOf(query), query);
});

export const POST = endpoint(
	{ act: 'recipe.edit', body: recipeCreateRequest },
	({ user, body }) => {
		const { name, kind, lines, ...fields } = body;
		const recipeId = orRefused(
			createRecipeWithDraft(
				actorOf(user!),
				{ name: name ?? '', kind: kind ?? '' },
				{ fields: draftFieldsOf(fields), lines: draftLinesOf(lines ?? []) }
			)
		);
		return versionAnswer(recipeId, 1, { status: 201, location: versionLocation(recipeId, 1) });
	}
);
