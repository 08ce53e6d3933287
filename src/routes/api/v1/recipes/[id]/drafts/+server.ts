import { endpoint } from '$lib/server/api/endpoint';
import { newDraftRequest } from '$lib/server/api/operations/recipe-writes';
import { actorOf } from '$lib/server/recipes/access';
import { startDraftFrom } from '$lib/server/recipes/drafts';
import { findRecipe, findVersion, latestVersion } from '$lib/server/recipes/queries';
import { versionAnswer, versionLocation } from '$lib/server/recipes/version-api';
import { RuleError } from '$lib/server/rule-error';

/** The recipe page's "New draft from version n": a copy of that version (the latest by default). */
export const POST = endpoint(
	{ act: 'recipe.edit', body: newDraftRequest },
	({ event, user, body }) => {
		const recipe = findRecipe(event.params.id!);
		if (!recipe) throw new RuleError('No recipe with this id.', { status: 404 });
		const n = body.fromVersion ?? latestVersion(recipe.id)!.n;
		const source = findVersion(recipe.id, n);
		if (!source)
			throw new RuleError(`${recipe.name} has no version ${n}.`, { field: 'fromVersion' });
		const draft = startDraftFrom(actorOf(user!), source.id);
		return versionAnswer(recipe.id, draft.n, {
			status: 201,
			location: versionLocation(recipe.id, draft.n)
		});
	}
);
