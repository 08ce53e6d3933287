import { endpoint } from '$lib/server/api/endpoint';
import { revisionFromIfMatch } from '$lib/server/api/etag';
import { versionLinesRequest } from '$lib/server/api/operations/recipe-writes';
import { actorOf } from '$lib/server/recipes/access';
import {
	draftLinesOf,
	saveDraftFromApi,
	storedDraft,
	versionAnswer,
	versionAt
} from '$lib/server/recipes/version-api';

/** The editor's save with new lines; the version's own fields stay as they are. */
export const PUT = endpoint(
	{ act: 'recipe.edit', body: versionLinesRequest },
	({ event, user, body }) => {
		const { recipe, version } = versionAt(event.params);
		const revision = revisionFromIfMatch(event, version.revision);
		saveDraftFromApi(
			actorOf(user!),
			{ recipe, version, revision },
			{ fields: storedDraft(version).fields, lines: draftLinesOf(body.lines) }
		);
		return versionAnswer(recipe.id, version.n);
	}
);
