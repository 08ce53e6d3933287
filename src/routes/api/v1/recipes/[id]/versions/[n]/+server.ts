import { ApiProblem, endpoint } from '$lib/server/api/endpoint';
import { revisionFromIfMatch } from '$lib/server/api/etag';
import { versionFieldsRequest } from '$lib/server/api/operations/recipe-writes';
import { actorOf } from '$lib/server/recipes/access';
import {
	draftFieldsOf,
	saveDraftFromApi,
	storedDraft,
	versionAnswer,
	versionAt
} from '$lib/server/recipes/version-api';

export const GET = endpoint({ act: 'recipe.view' }, ({ event }) => {
	const n = Number(event.params.n);
	if (!Number.isInteger(n) || n < 1)
		throw new ApiProblem(
			400,
			`A version number is a whole number from 1, not “${event.params.n}”.`,
			[{ path: 'n', message: 'Not a version number.' }]
		);
	return versionAnswer(event.params.id!, n);
});

/** The editor's save of the version's own fields; its lines stay as they are. */
export const PUT = endpoint(
	{ act: 'recipe.edit', body: versionFieldsRequest },
	({ event, user, body }) => {
		const { recipe, version } = versionAt(event.params);
		const revision = revisionFromIfMatch(event, version.revision);
		const stored = storedDraft(version);
		saveDraftFromApi(
			actorOf(user!),
			{ recipe, version, revision },
			{ fields: draftFieldsOf(body, stored.fields), lines: stored.lines }
		);
		return versionAnswer(recipe.id, version.n);
	}
);
