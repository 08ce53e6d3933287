import { requirePermission } from '$lib/server/guard';
import { materialOfLot } from '$lib/server/inventory/material';
import { lotQrText, qrSvg } from '$lib/server/inventory/labels';
import { findLot } from '$lib/server/inventory/lots';
import type { Lot } from '$lib/server/db/schema';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('lot.view');
	const ids = [...new Set(url.searchParams.getAll('lot'))].slice(0, 200);
	const lots = ids.map((id) => findLot(id)).filter((l): l is Lot => Boolean(l));
	const labels = await Promise.all(
		lots.map(async (l) => ({
			id: l.id,
			code: l.code,
			componentName: materialOfLot(l).name,
			supplierLot: `${l.supplier} ${l.supplierLot}`,
			expiresOn: l.expiresOn,
			dateKind: l.dateKind,
			storage: l.storage,
			qr: await qrSvg(lotQrText(l))
		}))
	);
	return { labels, missing: ids.length - lots.length };
};
