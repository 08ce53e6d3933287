import { hasRole } from '$lib/roles';
import { COMPONENT_EDITORS } from '$lib/server/components/access';
import { listComponents, molarMassOfComponent } from '$lib/server/components/library';
import { requireUser } from '$lib/server/guard';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const user = requireUser();
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
		canEdit: hasRole(user, COMPONENT_EDITORS)
	};
};
