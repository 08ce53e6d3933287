import { componentFilterOf, componentPageQuery } from '$lib/server/api/operations/recipes';
import { listComponentsPage } from '$lib/server/components/component-list';
import { molarMassOfComponent } from '$lib/server/components/library';
import { requirePermission } from '$lib/server/guard';
import { lenientQuery } from '$lib/server/list-paging';
import { may } from '$lib/permissions';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const user = requirePermission('component.view');
	const query = lenientQuery(componentPageQuery, url);
	const { rows, total } = listComponentsPage(componentFilterOf(query), query);
	return {
		components: rows.map((c) => ({
			id: c.id,
			name: c.name,
			formula: c.formula ?? '',
			category: c.category,
			casNumber: c.casNumber ?? '',
			molarMassGPerMol: molarMassOfComponent(c),
			hazards: c.ghsHazards.map((h) => h.code).join(' '),
			fromReference: c.fromReference
		})),
		total,
		paging: { page: query.page, limit: query.limit, sort: query.sort, dir: query.dir },
		filter: { category: query.category ?? '', q: query.q ?? '' },
		canEdit: may(user, 'component.edit')
	};
};
