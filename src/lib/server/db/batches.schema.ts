import { index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import type { BatchLineKind, BatchState, DeviationKind } from '$lib/batches';
import { lot } from './inventory.schema';
import { component, recipe, recipeLine, recipeVersion } from './recipes.schema';
import { user } from './schema';
import { createdAt, id } from './columns';

/** A batch of medium made from one approved recipe version: planned → in preparation → prepared → released | rejected. */
export const batch = sqliteTable(
	'batch',
	{
		id: id(),
		number: text('number').notNull().unique(),
		/** The year and sequence the number was drawn from, so numbering never repeats. */
		numberYear: integer('number_year').notNull(),
		numberSeq: integer('number_seq').notNull(),
		recipeId: text('recipe_id')
			.notNull()
			.references(() => recipe.id),
		versionId: text('version_id')
			.notNull()
			.references(() => recipeVersion.id),
		targetVolumeMl: integer('target_volume_ml').notNull(),
		plannedOn: text('planned_on').notNull(),
		intendedUse: text('intended_use').notNull(),
		state: text('state').$type<BatchState>().notNull().default('planned'),
		createdById: text('created_by_id')
			.notNull()
			.references(() => user.id),
		preparedById: text('prepared_by_id').references(() => user.id),
		startedAt: integer('started_at', { mode: 'timestamp_ms' }),
		preparedAt: integer('prepared_at', { mode: 'timestamp_ms' }),
		measuredPh: real('measured_ph'),
		measuredOsmolality: real('measured_osmolality_mosm_per_kg'),
		reviewedById: text('reviewed_by_id').references(() => user.id),
		reviewedAt: integer('reviewed_at', { mode: 'timestamp_ms' }),
		reviewNote: text('review_note').notNull().default(''),
		createdAt: createdAt()
	},
	(t) => [
		index('batch_state_idx').on(t.state, t.plannedOn),
		index('batch_recipe_idx').on(t.recipeId),
		index('batch_planned_idx').on(t.plannedOn, t.number),
		uniqueIndex('batch_number_seq_idx').on(t.numberYear, t.numberSeq)
	]
);

/** One line of the batch sheet, in the recipe's order of addition, with what was actually added. */
export const batchLine = sqliteTable(
	'batch_line',
	{
		id: id(),
		batchId: text('batch_id')
			.notNull()
			.references(() => batch.id),
		position: integer('position').notNull(),
		kind: text('kind').$type<BatchLineKind>().notNull(),
		recipeLineId: text('recipe_line_id')
			.notNull()
			.references(() => recipeLine.id),
		/** The component weighed (the recipe line's shelf form, or its component). */
		componentId: text('component_id').references(() => component.id),
		stockRecipeId: text('stock_recipe_id').references(() => recipe.id),
		tolerancePercent: real('tolerance_percent').notNull(),
		lotId: text('lot_id').references(() => lot.id),
		/** What the technician typed, kept as typed for the record; actual_ug or actual_ul is it read. */
		actualText: text('actual_text'),
		/** Required mass of a component line for the chosen lot; µg, so sub-milligram lines keep their precision. */
		requiredUg: integer('required_ug'),
		/** Required stock volume of a stock line. */
		requiredUl: integer('required_ul'),
		/** What went in, read from actual_text: a component line's mass or a stock line's volume. */
		actualUg: integer('actual_ug'),
		actualUl: integer('actual_ul'),
		/** Taken from the lot's stock in its base unit: mg for a lot kept by mass, µL for one kept by volume. */
		consumedMg: integer('consumed_mg'),
		consumedUl: integer('consumed_ul'),
		stockSource: text('stock_source').notNull().default(''),
		doneById: text('done_by_id').references(() => user.id),
		doneAt: integer('done_at', { mode: 'timestamp_ms' })
	},
	(t) => [
		index('batch_line_batch_idx').on(t.batchId, t.position),
		index('batch_line_lot_idx').on(t.lotId)
	]
);

/** Deviations are history: append-only by trigger. */
export const batchDeviation = sqliteTable(
	'batch_deviation',
	{
		id: id(),
		batchId: text('batch_id')
			.notNull()
			.references(() => batch.id),
		lineId: text('line_id').references(() => batchLine.id),
		kind: text('kind').$type<DeviationKind>().notNull(),
		detail: text('detail').notNull(),
		reason: text('reason').notNull(),
		recordedById: text('recorded_by_id')
			.notNull()
			.references(() => user.id),
		at: createdAt()
	},
	(t) => [index('batch_deviation_batch_idx').on(t.batchId)]
);

/**
 * A correction of a line already signed as done: a new signed entry with its reason. The line shows
 * the corrected values; the original stays here (and in the trail). Append-only by trigger.
 */
export const batchLineCorrection = sqliteTable(
	'batch_line_correction',
	{
		id: id(),
		batchId: text('batch_id')
			.notNull()
			.references(() => batch.id),
		lineId: text('line_id')
			.notNull()
			.references(() => batchLine.id),
		fromText: text('from_text').notNull(),
		fromUg: integer('from_ug'),
		fromUl: integer('from_ul'),
		toText: text('to_text').notNull(),
		toUg: integer('to_ug'),
		toUl: integer('to_ul'),
		reason: text('reason').notNull(),
		correctedById: text('corrected_by_id')
			.notNull()
			.references(() => user.id),
		signatureId: text('signature_id').notNull(),
		at: createdAt()
	},
	(t) => [index('batch_line_correction_line_idx').on(t.lineId, t.at)]
);

export type Batch = typeof batch.$inferSelect;
export type BatchLine = typeof batchLine.$inferSelect;
export type BatchDeviation = typeof batchDeviation.$inferSelect;
export type BatchLineCorrection = typeof batchLineCorrection.$inferSelect;
