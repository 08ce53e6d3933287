import { endpoint } from '$lib/server/api/endpoint';
import { revisionFromIfMatch, withEtag } from '$lib/server/api/etag';
import { actorOf } from '$lib/server/recipes/access';
import { findVersionById } from '$lib/server/recipes/queries';
import { tellReviewers } from '$lib/server/recipes/review-queue';
import { versionAt, type SubmitOutcome } from '$lib/server/recipes/version-api';
import { submitForReview } from '$lib/server/recipes/workflow';

export const POST = endpoint({ act: 'recipe.edit' }, async ({ event, user }) => {
	const { version } = versionAt(event.params);
	const revision = revisionFromIfMatch(event, version.revision);
	submitForReview(actorOf(user!), version.id, revision);
	const { mailed, told } = await tellReviewers(version);
	const outcome: SubmitOutcome = {
		n: version.n,
		status: 'in_review',
		reviewersMailed: mailed,
		message: `Version ${version.n} is submitted for review. ${told}`
	};
	return withEtag(outcome, findVersionById(version.id)!.revision);
});
