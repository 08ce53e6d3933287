import { endpoint } from '$lib/server/api/endpoint';
import { feedDesignRequest } from '$lib/server/api/operations/studies';
import { listComponents } from '$lib/server/components/library';
import { designFeed } from '$lib/server/studies/feed-designer';
import { loadStudyInputs } from '$lib/server/studies/queries';

export const POST = endpoint({ act: 'study.use', body: feedDesignRequest }, ({ event, body }) => {
	const { inputs } = loadStudyInputs(event.params.id!);
	return designFeed(inputs, new Map(listComponents().map((c) => [c.id, c])), body);
});
