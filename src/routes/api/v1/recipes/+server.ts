import { endpoint } from '$lib/server/api/endpoint';
import { recipeListQuery } from '$lib/server/api/operations/recipes';
import { parseQuery } from '$lib/server/api/query';
import { listRecipes } from '$lib/server/recipes/queries';
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
