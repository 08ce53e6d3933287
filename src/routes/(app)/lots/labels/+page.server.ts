import { labelElementsOf, type PictogramId } from '$chemistry';
import { solutionStatements } from '$lib/server/batches/preparation-hazards';
import { currentApprovedVersion } from '$lib/server/recipes/queries';
import { requirePermission } from '$lib/server/guard';
import { materialOfLot, type LotMaterial } from '$lib/server/inventory/material';
import { lotQrText, qrSvg, withoutSourceNotes } from '$lib/server/inventory/labels';
import { findLot } from '$lib/server/inventory/lots';
import type { Lot } from '$lib/server/db/schema';
import type { LotLabelView } from '$lib/lot-labels';
import type { PageServerLoad } from './$types';

/** The lot's own date, or the retest date a recall set when that comes first. */
function governingDate(lot: Lot): LotLabelView['date'] {
	if (lot.retestOn !== null && lot.retestOn < lot.expiresOn)
		return { kind: 'retest', on: lot.retestOn };
	return { kind: lot.dateKind, on: lot.expiresOn };
}

/**
 * The GHS pictograms of what the lot holds: a received component as supplied, or a stock made here
 * as the solution it is (its statements at its own concentrations).
 */
function pictogramsOf(material: LotMaterial): PictogramId[] {
	if (material.component)
		return labelElementsOf(material.component.ghsHazards.map((h) => h.code)).pictograms;
	const version = material.stock ? currentApprovedVersion(material.stock.recipeId) : undefined;
	if (!version) return [];
	return labelElementsOf(solutionStatements(version).map((h) => h.code)).pictograms;
}

async function labelOf(lot: Lot): Promise<LotLabelView> {
	const material = materialOfLot(lot);
	return {
		id: lot.id,
		code: lot.code,
		componentName: withoutSourceNotes(material.name),
		status: lot.status,
		supplier: withoutSourceNotes(lot.supplier),
		supplierLot: lot.supplierLot,
		date: governingDate(lot),
		storage: withoutSourceNotes(lot.storage),
		pictograms: pictogramsOf(material),
		qr: await qrSvg(lotQrText(lot))
	};
}

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('lot.view');
	const ids = [...new Set(url.searchParams.getAll('lot'))].slice(0, 200);
	const lots = ids.map((id) => findLot(id)).filter((l): l is Lot => Boolean(l));
	const labels = await Promise.all(lots.map(labelOf));
	return { labels, missing: ids.length - lots.length };
};
