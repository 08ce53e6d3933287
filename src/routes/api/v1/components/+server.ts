import { endpoint } from '$lib/server/api/endpoint';
import { componentListQuery } from '$lib/server/api/operations/recipes';
import { parseQuery } from '$lib/server/api/query';
import { listComponentsPage } from '$lib/server/components/component-list';

export const GET = endpoint({ act: 'component.view' }, ({ event }) => {
	const query = parseQuery(componentListQuery, event.url);
	const { rows, total } = listComponentsPage({ category: query.category, search: query.q }, query);
	return { items: rows, total, page: query.page, limit: query.limit };
});
