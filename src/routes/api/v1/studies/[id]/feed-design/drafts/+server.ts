import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api/endpoint';
import { feedDesignDraftsRequest } from '$lib/server/api/operations/studies';
import { actorOf } from '$lib/server/recipes/access';
import { saveFeedDesignDrafts } from '$lib/server/studies/feed-drafts';

export const POST = endpoint(
	{ act: 'study.save-feed-drafts', body: feedDesignDraftsRequest },
	({ event, user, body }) => {
		const drafts = saveFeedDesignDrafts(actorOf(user!), event.params.id!, body);
		return json({ drafts }, { status: 201 });
	}
);
