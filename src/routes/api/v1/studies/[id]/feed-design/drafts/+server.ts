import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api/endpoint';
import { feedDesignDraftsRequest } from '$lib/server/api/operations/studies';
import { actorOf } from '$lib/server/recipes/access';
import { saveFeedDesignDrafts } from '$lib/server/studies/feed-drafts';
import { FEED_DRAFT_ROLES } from '$lib/studies';

export const POST = endpoint({ access: { roles: [...FEED_DRAFT_ROLES] }, body: feedDesignDraftsRequest }, ({ event, user, body }) => {
	const drafts = saveFeedDesignDrafts(actorOf(user!), event.params.id!, body);
	return json({ drafts }, { status: 201 });
});
