import { describe, expect, it } from 'vitest';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { databaseAsOf } from './migration-steps';

describe('batch line quantities in columns named by their unit', () => {
	it('moves each stored quantity to the column of its unit, also on a prepared batch, and drops the old columns', () => {
		const sqlite = databaseAsOf('0013_profile_element_statements');
		// Rows as the previous release wrote them; references are not what is tested here.
		sqlite.pragma('foreign_keys = OFF');
		sqlite
			.prepare(
				`INSERT INTO batch (id, number, number_year, number_seq, recipe_id, version_id, target_volume_ml, planned_on, intended_use, state, created_by_id, created_at)
				 VALUES ('b1', 'MB-2026-0001', 2026, 1, 'r1', 'v1', 1000, '2026-01-05', 'Flask 1', 'prepared', 'u1', 0)`
			)
			.run();
		const lot = sqlite.prepare(
			`INSERT INTO lot (id, code, component_id, supplier, supplier_lot, quantity_kind, received_quantity, received_unit, received_on, expires_on, received_by_id, created_at)
			 VALUES (?, ?, 'c1', 'Supplier', ?, ?, 500000, 'g', '2026-01-01', '2027-01-01', 'u1', 0)`
		);
		lot.run('lot-mass', 'L-2026-0001', 'S1', 'mass');
		lot.run('lot-volume', 'L-2026-0002', 'S2', 'volume');
		const line = sqlite.prepare(
			`INSERT INTO batch_line (id, batch_id, position, kind, recipe_line_id, tolerance_percent, lot_id, required_quantity, actual_quantity, actual_text, consumed_quantity)
			 VALUES (?, 'b1', ?, ?, 'rl', 2, ?, ?, ?, ?, ?)`
		);
		// 12.5 g required (µg), 12.6 g weighed (µg), 12 600 mg taken from a lot kept by mass.
		line.run('weighed', 1, 'component', 'lot-mass', 12_500_000, 12_600_000, '12.6 g', 12_600);
		// 2.5 mL of stock required and added (µL); no lot.
		line.run('stock', 2, 'stock', null, 2_500, 2_500, '2.5 mL', null);
		// A liquid weighed by mass and taken in µL from a lot kept by volume.
		line.run('liquid', 3, 'component', 'lot-volume', 1_300_000, 1_310_000, '1.31 g', 1_070);

		migrate(drizzle(sqlite), { migrationsFolder: 'drizzle' });
		const lines = sqlite
			.prepare(
				`SELECT id, required_ug, required_ul, actual_ug, actual_ul, consumed_mg, consumed_ul FROM batch_line ORDER BY position`
			)
			.all();
		expect(lines).toEqual([
			{
				id: 'weighed',
				required_ug: 12_500_000,
				required_ul: null,
				actual_ug: 12_600_000,
				actual_ul: null,
				consumed_mg: 12_600,
				consumed_ul: null
			},
			{
				id: 'stock',
				required_ug: null,
				required_ul: 2_500,
				actual_ug: null,
				actual_ul: 2_500,
				consumed_mg: null,
				consumed_ul: null
			},
			{
				id: 'liquid',
				required_ug: 1_300_000,
				required_ul: null,
				actual_ug: 1_310_000,
				actual_ul: null,
				consumed_mg: null,
				consumed_ul: 1_070
			}
		]);
		const columns = (
			sqlite.prepare(`PRAGMA table_info(batch_line)`).all() as { name: string }[]
		).map((c) => c.name);
		expect(columns).not.toContain('required_quantity');
		expect(columns).not.toContain('consumed_quantity');
		// The prepared batch's record is locked again.
		expect(() =>
			sqlite.prepare(`UPDATE batch_line SET actual_text = 'changed' WHERE id = 'weighed'`).run()
		).toThrow('the batch is prepared; its record cannot change');
		sqlite.close();
	});
});
