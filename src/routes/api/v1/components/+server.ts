import { endpoint } from '$lib/server/api/endpoint';
import { componentFilterOf, componentListQuery } from '$lib/server/api/operations/recipes';
import { parseQuery } from '$lib/server/api/query';
import { listComponentsByCursor } from '$lib/server/components/component-list';

export const GET = endpoint({ act: 'component.view' }, ({ event }) => {
	const query = parseQuery(componentListQuery, event.url);
	return listComponentsByCursor(componentFilterOf(query), query);
});
