// A site's size: 40,000 lots, more than SQLite lets one statement bind as parameters (32,766).
// Lists, on-hand sums, the inventory alerts and the export must all still answer.
import { eq, sql } from 'drizzle-orm';
import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { db } from '$lib/server/db';
import { component, lot, stockEntry } from '$lib/server/db/schema';
import {
	componentsBelowReorder,
	expiringLots,
	quarantinedLots
} from '$lib/server/inventory/alerts';
import { exportLotsCsv } from '$lib/server/inventory/csv';
import { listLots, listLotsPage } from '$lib/server/inventory/lot-list';
import { cloneRows } from '$lib/server/scale/clone-rows';
import { makeLead, makeLot, today } from './inventory-fixtures';

const COPIES = 40_000;

/** Copies one real lot and its receipt COPIES times in SQL, triggers active. */
function cloneLot(templateId: string) {
	db.transaction((tx) => {
		cloneRows(tx, lot, `t.id = '${templateId}'`, COPIES, {
			id: `'bulk-' || n.i`,
			code: `'L-BULK-' || printf('%05d', n.i)`,
			supplier_lot: `'S-' || n.i`
		});
		cloneRows(tx, stockEntry, `t.lot_id = '${templateId}' and t.kind = 'receipt'`, COPIES, {
			id: `'bulk-entry-' || n.i`,
			lot_id: `'bulk-' || n.i`,
			quantity: `n.i * 1000`
		});
	});
}

beforeAll(async () => {
	seedReferenceLibrary();
	const lead = await makeLead();
	const template = makeLot(lead.actor);
	cloneLot(template.id);
}, 60_000);

describe(`${COPIES.toLocaleString('en')} lots`, () => {
	it('pages the list with an honest total and the right stock on hand', () => {
		const page = listLotsPage({}, { page: 3, limit: 50, sort: 'onHand', dir: 'desc' }, today);
		expect(page.total).toBe(COPIES + 1);
		expect(page.rows).toHaveLength(50);
		// Largest first: copy i holds i × 1000 mg; page 3 starts at the 101st largest.
		expect(page.rows[0]).toMatchObject({ code: 'L-BULK-39900', onHand: 39_900_000 });
		expect(page.rows[49]).toMatchObject({ code: 'L-BULK-39851', onHand: 39_851_000 });
	});

	it('keeps every lot’s on-hand equal to the sum of its ledger', () => {
		const mismatched = db.all(
			sql.raw(
				`select l.id from lot l left join lot_on_hand o on o.lot_id = l.id
				 where coalesce(o.quantity, 0) <> (select coalesce(sum(quantity), 0) from stock_entry where lot_id = l.id)`
			)
		);
		expect(mismatched).toEqual([]);
	});

	it('searches and counts without binding ids', () => {
		const found = listLotsPage(
			{ search: 'L-BULK-1234' },
			{ page: 1, limit: 50, sort: 'code', dir: 'asc' },
			today
		);
		// L-BULK-01234 does not contain "L-BULK-1234"; 12340–12349 do.
		expect(found.total).toBe(10);
		expect(found.rows.map((r) => r.code)[0]).toBe('L-BULK-12340');
	});

	it('lists every lot for the export, the alerts and the digest', () => {
		expect(listLots({}, today)).toHaveLength(COPIES + 1);
		// Sodium chloride: the template's 100 g plus copy i's i g, i = 1 … 40,000 (Gauss: n(n+1)/2).
		db.update(component)
			.set({ reorderLevelG: 1e12 })
			.where(eq(component.id, 'sodium-chloride'))
			.run();
		const low = componentsBelowReorder(today).find((c) => c.componentId === 'sodium-chloride');
		expect(low).toMatchObject({ lots: COPIES + 1, usableG: 100 + (COPIES * (COPIES + 1)) / 2 });
		expect(quarantinedLots(today)).toHaveLength(0);
		// None of the copies expires within 30 days; the listing stops at its limit anyway.
		expect(expiringLots(30, today).total).toBe(0);
		const all = expiringLots(400, today, undefined, { listed: 10 });
		expect(all).toMatchObject({ total: COPIES + 1, moreThanTotal: false });
		expect(all.lots).toHaveLength(10);
		// The inventory page counts so far and says "more than"; just enough lots is still exact.
		expect(expiringLots(400, today, undefined, { countUpTo: 1000 })).toMatchObject({
			total: 1000,
			moreThanTotal: true
		});
		expect(expiringLots(400, today, undefined, { countUpTo: COPIES + 1 })).toMatchObject({
			total: COPIES + 1,
			moreThanTotal: false
		});
		const text = exportLotsCsv(today);
		// After its one line of preamble, a header and a row per lot.
		const csv = Papa.parse<Record<string, string>>(text.slice(text.indexOf('\n') + 1), {
			header: true,
			skipEmptyLines: true
		});
		expect(csv.data).toHaveLength(COPIES + 1);
	});
});
