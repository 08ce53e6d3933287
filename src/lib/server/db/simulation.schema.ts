import { index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import type { SimulateRequest } from '../api/operations/simulation';
import { user } from './schema';

/** A simulation request a person saved to reload or compare; private to its owner. */
export const simulationScenario = sqliteTable(
	'simulation_scenario',
	{
		id: text('id')
			.primaryKey()
			.$defaultFn(() => crypto.randomUUID()),
		ownerId: text('owner_id')
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		mode: text('mode').$type<SimulateRequest['mode']>().notNull(),
		request: text('request', { mode: 'json' }).$type<SimulateRequest>().notNull(),
		notes: text('notes'),
		createdAt: integer('created_at', { mode: 'timestamp_ms' })
			.notNull()
			.$defaultFn(() => new Date()),
		updatedAt: integer('updated_at', { mode: 'timestamp_ms' })
			.notNull()
			.$defaultFn(() => new Date())
	},
	(t) => [
		uniqueIndex('scenario_owner_name_idx').on(t.ownerId, t.name),
		index('scenario_owner_updated_idx').on(t.ownerId, t.updatedAt)
	]
);

export type SimulationScenario = typeof simulationScenario.$inferSelect;
