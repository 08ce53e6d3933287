// The overview's inventory alerts count what the inventory page lists, counted here independently
// from the lot table itself.
import { eq, sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { isoToday } from '$lib/inventory';
import { db } from '$lib/server/db';
import { lot } from '$lib/server/db/schema';
import { addDays, componentsBelowReorder } from '$lib/server/inventory/alerts';
import { inventoryAlertCounts } from '$lib/server/inventory/overview';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

describe('the inventory alerts on the overview', () => {
	it('counts expiring, below-reorder and quarantined as the lot table holds them', () => {
		const counts = inventoryAlertCounts();
		const before = addDays(isoToday(), counts.expiringDays);
		const [{ expiring }] = db.all<{ expiring: number }>(
			sql`select count(*) as expiring from lot l join lot_on_hand o on o.lot_id = l.id
			    where l.expires_on <= ${before} and l.status <> 'rejected' and o.quantity > 0`
		);
		const quarantined = db.select().from(lot).where(eq(lot.status, 'quarantine')).all().length;
		expect(counts).toEqual({
			expiringDays: 30,
			expiring,
			expiringMoreThan: false,
			belowReorder: componentsBelowReorder().length,
			quarantined
		});
		// The demo has each kind of alert, so none of these is a zero that could hide a miscount.
		expect(Math.min(counts.expiring, counts.belowReorder, counts.quarantined)).toBeGreaterThan(0);
	});
});
