import { endpoint } from '$lib/server/api/endpoint';
import { componentListQuery } from '$lib/server/api/operations/recipes';
import { parseQuery } from '$lib/server/api/query';
import { listComponents } from '$lib/server/components/library';

export const GET = endpoint({ act: 'component.view' }, ({ event }) => {
	const query = parseQuery(componentListQuery, event.url);
	const q = query.q?.toLowerCase();
	const items = listComponents().filter(
		(c) =>
			(!query.category || c.category === query.category) &&
			(!q ||
				[c.name, c.formula ?? '', c.casNumber ?? '', ...c.synonyms].some((t) =>
					t.toLowerCase().includes(q)
				))
	);
	return { items, total: items.length };
});
