import { requirePermission } from '$lib/server/guard';
import { listComponents, molarMassOfComponent } from '$lib/server/components/library';
import type { PageServerLoad } from './$types';
import { may } from '$lib/permissions';

export const load: PageServerLoad = async () => {
	const user = requirePermission('component.view');
	return {
		components: listComponents().map((c) => ({
			id: c.id,
			name: c.name,
			formula: c.formula ?? '',
			category: c.category,
			casNumber: c.casNumber ?? '',
			molarMassGPerMol: molarMassOfComponent(c),
			hazards: c.ghsHazards.map((h) => h.code).join(' '),
			fromReference: c.fromReference
		})),
		canEdit: may(user, 'component.edit')
	};
};
