// The inventory lead's alerts in brief, for the overview: how many lots expire soon, how many
// components are below their reorder level and how many lots wait in quarantine.
import { DEFAULT_EXPIRY_WINDOW_DAYS } from '$lib/inventory';
import { componentsBelowReorder, EXPIRING_COUNTED_UP_TO, expiringLots } from './alerts';
import { countLots } from './lot-list';

export interface InventoryAlertCounts {
	expiringDays: number;
	expiring: number;
	/** the expiring count stopped at EXPIRING_COUNTED_UP_TO */
	expiringMoreThan: boolean;
	belowReorder: number;
	quarantined: number;
}

export function inventoryAlertCounts(): InventoryAlertCounts {
	const expiring = expiringLots(DEFAULT_EXPIRY_WINDOW_DAYS, undefined, undefined, {
		listed: 1,
		countUpTo: EXPIRING_COUNTED_UP_TO
	});
	const quarantined = countLots({ status: 'quarantine' });
	return {
		expiringDays: DEFAULT_EXPIRY_WINDOW_DAYS,
		expiring: expiring.total,
		expiringMoreThan: expiring.moreThanTotal,
		belowReorder: componentsBelowReorder().length,
		quarantined
	};
}
