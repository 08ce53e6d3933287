import { error } from '@sveltejs/kit';
import { requirePermission } from '$lib/server/guard';
import { materialOfLot } from '$lib/server/inventory/material';
import { findLot } from '$lib/server/inventory/lots';
import { batchesMadeFromLot, RECALL_ATTENTION } from '$lib/server/inventory/where-used';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requirePermission('lot.view');
	const lot = findLot(params.id);
	if (!lot) error(404, { message: 'No lot with this id.' });
	const uses = batchesMadeFromLot(lot.id).map((u) => ({
		...u,
		attention: RECALL_ATTENTION.includes(u.state)
	}));
	return { lot, componentName: materialOfLot(lot).name, uses };
};
