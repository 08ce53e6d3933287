import { isExpired, isoToday } from '$lib/inventory';
import { personName } from '../recipes/queries';
import { RuleError } from '../rule-error';
import { certificatesOf } from './certificates';
import { onHandOf } from './ledger';
import { lotLedgerPage, type LedgerCursor } from './ledger-page';
import { findLot } from './lots';
import { materialOfLot } from './material';
import { batchesMadeFromLot } from './where-used';

/** Everything about one lot: what it is, its stock and ledger, certificates and where it was used. */
export function lotView(
	lotId: string,
	{
		today = isoToday(),
		ledgerBefore = null
	}: { today?: string; ledgerBefore?: LedgerCursor | null } = {}
) {
	const lot = findLot(lotId);
	if (!lot) throw new RuleError('No lot with this id.', { status: 404 });
	const material = materialOfLot(lot);
	const ledger = lotLedgerPage(lotId, { before: ledgerBefore });
	return {
		lot: {
			...lot,
			expired: isExpired(lot.expiresOn, today),
			receivedByName: personName(lot.receivedById),
			statusChangedByName: personName(lot.statusChangedById)
		},
		component: {
			id: material.component?.id ?? null,
			name: material.name,
			formula: material.component?.formula ?? null,
			densityGPerMl: material.densityGPerMl,
			ghsHazards: material.component?.ghsHazards ?? []
		},
		stock: material.stock,
		onHand: onHandOf(lotId),
		ledger: ledger.entries,
		ledgerTotal: ledger.total,
		ledgerEarlier: ledger.earlier,
		certificates: certificatesOf(lotId).map((c) => ({
			id: c.id,
			displayName: c.displayName,
			mediaType: c.mediaType,
			sizeBytes: c.sizeBytes,
			uploadedAt: c.uploadedAt
		})),
		whereUsed: batchesMadeFromLot(lotId)
	};
}
