import { describe, expect, it } from 'vitest';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { databaseAsOf } from './migration-steps';

describe('moving the feeding plan from the study onto each feed', () => {
	it('copies a saved study’s plan onto every one of its feeds, then drops the study columns', () => {
		const sqlite = databaseAsOf('0008_profile_substrate_yields');
		// Rows as the previous release wrote them; references are not what is tested here.
		sqlite.pragma('foreign_keys = OFF');
		sqlite
			.prepare(
				`INSERT INTO study (id, name, basal_version_id, profile_id, vessel_id, target_basis, target_value, initial_volume_l, inoculum_density, duration_h,
				 feed_strategy, feed_start_h, feed_mu_set_per_h, temperature_c, pressure_kpa, o2_mole_fraction, do_setpoint_percent, safety_factor, created_by_id, created_at, updated_at)
				 VALUES ('s1', 'Old study', 'v1', 'p1', 'e1', 'biomassGPerL', 20, 5, 0.1, 30, 'exponential', 10, 0.15, 37, 101.325, 0.2095, 30, 1.2, 'u1', 0, 0)`
			)
			.run();
		const feed = sqlite.prepare(
			`INSERT INTO study_feed (id, study_id, version_id, position, volume_l) VALUES (?, 's1', ?, ?, ?)`
		);
		feed.run('f1', 'v2', 0, 2);
		feed.run('f2', 'v3', 1, 0.5);

		migrate(drizzle(sqlite), { migrationsFolder: 'drizzle' });
		const feeds = sqlite
			.prepare(
				`SELECT id, strategy, start_h, mu_set_per_h, volume_l FROM study_feed ORDER BY position`
			)
			.all();
		expect(feeds).toEqual([
			{ id: 'f1', strategy: 'exponential', start_h: 10, mu_set_per_h: 0.15, volume_l: 2 },
			{ id: 'f2', strategy: 'exponential', start_h: 10, mu_set_per_h: 0.15, volume_l: 0.5 }
		]);
		const columns = (sqlite.prepare(`PRAGMA table_info(study)`).all() as { name: string }[]).map(
			(c) => c.name
		);
		expect(columns).not.toContain('feed_strategy');
		expect(columns).not.toContain('feed_start_h');
		expect(columns).toContain('duration_h');
		sqlite.close();
	});
});
