import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { describe, expect, it } from 'vitest';
import { databaseAsOf } from './migration-steps';

describe('versions approved before snapshots existed', () => {
	it('keep the library rows of their lines as they stood at migration, in the shape the app reads', () => {
		const sqlite = databaseAsOf('0022_recipe_version_component');
		sqlite.pragma('foreign_keys = OFF');
		sqlite.exec(`
			INSERT INTO component (id, name, category, formula, ghs_hazards, synonyms, from_reference, revision, created_at, updated_at, ions)
			VALUES ('mgso4', 'Magnesium sulfate', 'salt', 'MgSO4', '[]', '["x"]', 1, 3, 1700000000000, 1700000001000, '[{"ion":"Mg^2+","count":1}]');
			INSERT INTO recipe (id, name, kind, owner_id, created_at) VALUES ('r1', 'Old medium', 'basal', 'u1', 0);
			INSERT INTO recipe_version (id, recipe_id, n, status, author_id, created_at, updated_at)
			VALUES ('v1', 'r1', 1, 'draft', 'u1', 0, 0), ('v2', 'r1', 2, 'draft', 'u1', 0, 0);
			INSERT INTO recipe_line (id, version_id, position, kind, component_id, amount, unit, tolerance_percent, note)
			VALUES ('l1', 'v1', 1, 'component', 'mgso4', 0.2, 'g/L', 2, ''), ('l2', 'v2', 1, 'component', 'mgso4', 0.3, 'g/L', 2, '');
			UPDATE recipe_version SET status = 'approved' WHERE id = 'v1';
		`);
		migrate(drizzle(sqlite), { migrationsFolder: 'drizzle' });
		const rows = sqlite
			.prepare(
				'SELECT version_id, component_id, component_revision, data FROM recipe_version_component'
			)
			.all() as {
			version_id: string;
			component_id: string;
			component_revision: number;
			data: string;
		}[];
		expect(rows.map((r) => [r.version_id, r.component_id, r.component_revision])).toEqual([
			['v1', 'mgso4', 3]
		]);
		expect(JSON.parse(rows[0].data)).toEqual({
			id: 'mgso4',
			name: 'Magnesium sulfate',
			category: 'salt',
			formula: 'MgSO4',
			molarMassGPerMol: null,
			casNumber: null,
			elementalMassFractions: null,
			fractionsNote: null,
			ions: [{ ion: 'Mg^2+', count: 1 }],
			osmoticCoefficient: null,
			osmoticCoefficientSource: null,
			solubility: null,
			ghsHazards: [],
			hazardSource: null,
			storage: '',
			basisComponentId: null,
			synonyms: ['x'],
			fromReference: true,
			reorderLevelG: null,
			densityGPerMl: null,
			revision: 3,
			createdAt: new Date(1700000000000).toISOString(),
			updatedAt: new Date(1700000001000).toISOString()
		});
		expect(() =>
			sqlite.prepare(`DELETE FROM recipe_version_component WHERE version_id = 'v1'`).run()
		).toThrow(/kept/);
	});
});
