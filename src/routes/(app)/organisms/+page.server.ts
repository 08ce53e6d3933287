import { requirePermission } from '$lib/server/guard';
import { listProfiles } from '$lib/server/studies/queries';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('study.use');
	return {
		profiles: listProfiles().map((p) => ({
			id: p.id,
			name: p.name,
			group: p.group,
			kind: p.kind,
			muMaxPerH: p.muMaxPerH,
			yieldXSGPerG: p.yieldXSGPerG,
			carbonSourceId: p.carbonSourceId,
			isDemo: p.isDemo
		}))
	};
};
