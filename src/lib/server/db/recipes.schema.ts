import { sql } from 'drizzle-orm';
import {
	index,
	integer,
	primaryKey,
	real,
	sqliteTable,
	text,
	uniqueIndex,
	type AnySQLiteColumn
} from 'drizzle-orm/sqlite-core';
import type { GhsHazard, IonSpec, SolubilitySpec } from '$chemistry';
import type { LineKind, RecipeKind, VersionStatus } from '$lib/recipes';
import { user } from './schema';
import { chainColumns, createdAt, id } from './columns';

/** The component library: the reference data loaded at start, plus what people add. */
export const component = sqliteTable(
	'component',
	{
		id: id(),
		name: text('name').notNull().unique(),
		category: text('category').notNull(),
		formula: text('formula'),
		/** Only for a material without a formula but with a known average molar mass. */
		molarMassGPerMol: real('molar_mass_g_per_mol'),
		casNumber: text('cas_number'),
		/** Complex materials only: g element per g, typical values until a lot certificate replaces them. */
		elementalMassFractions: text('elemental_mass_fractions', { mode: 'json' }).$type<
			Record<string, number>
		>(),
		fractionsNote: text('fractions_note'),
		ions: text('ions', { mode: 'json' }).$type<IonSpec[]>(),
		osmoticCoefficient: real('osmotic_coefficient'),
		osmoticCoefficientSource: text('osmotic_coefficient_source'),
		solubility: text('solubility', { mode: 'json' }).$type<SolubilitySpec>(),
		ghsHazards: text('ghs_hazards', { mode: 'json' }).$type<GhsHazard[]>().notNull(),
		hazardSource: text('hazard_source'),
		storage: text('storage').notNull().default(''),
		/** The form an amount of this one is expressed as: the anhydrous salt of a hydrate, the free amino acid of a salt. */
		basisComponentId: text('basis_component_id').references((): AnySQLiteColumn => component.id),
		synonyms: text('synonyms', { mode: 'json' }).$type<string[]>().notNull(),
		/** True for rows loaded from the reference library. */
		fromReference: integer('from_reference', { mode: 'boolean' }).notNull().default(false),
		reorderLevelG: real('reorder_level_g'),
		densityGPerMl: real('density_g_per_ml'),
		revision: integer('revision').notNull().default(1),
		createdAt: createdAt(),
		updatedAt: integer('updated_at', { mode: 'timestamp_ms' })
			.notNull()
			.$defaultFn(() => new Date())
	},
	(t) => [index('component_category_idx').on(t.category)]
);

export const recipe = sqliteTable('recipe', {
	id: id(),
	name: text('name').notNull().unique(),
	kind: text('kind').$type<RecipeKind>().notNull(),
	ownerId: text('owner_id')
		.notNull()
		.references(() => user.id),
	createdAt: createdAt()
});

/**
 * One version of a recipe. Approved and retired versions are immutable: triggers refuse any change
 * but approved → retired, and any change to their lines.
 */
export const recipeVersion = sqliteTable(
	'recipe_version',
	{
		id: id(),
		recipeId: text('recipe_id')
			.notNull()
			.references(() => recipe.id),
		n: integer('n').notNull(),
		status: text('status').$type<VersionStatus>().notNull().default('draft'),
		authorId: text('author_id')
			.notNull()
			.references(() => user.id),
		basedOnVersionId: text('based_on_version_id').references(
			(): AnySQLiteColumn => recipeVersion.id
		),
		targetPh: real('target_ph'),
		osmolalityMinMOsmPerKg: real('osmolality_min_mosm_per_kg'),
		osmolalityMaxMOsmPerKg: real('osmolality_max_mosm_per_kg'),
		preparationTemperatureC: real('preparation_temperature_c').notNull().default(25),
		shelfLifeDays: integer('shelf_life_days'),
		storage: text('storage').notNull().default(''),
		instructions: text('instructions').notNull().default(''),
		changeNote: text('change_note').notNull().default(''),
		/** Optimistic concurrency: a save names the revision it started from. */
		revision: integer('revision').notNull().default(1),
		updatedById: text('updated_by_id').references(() => user.id),
		createdAt: createdAt(),
		updatedAt: integer('updated_at', { mode: 'timestamp_ms' })
			.notNull()
			.$defaultFn(() => new Date()),
		submittedAt: integer('submitted_at', { mode: 'timestamp_ms' }),
		approvedAt: integer('approved_at', { mode: 'timestamp_ms' }),
		approvedById: text('approved_by_id').references(() => user.id),
		retiredAt: integer('retired_at', { mode: 'timestamp_ms' })
	},
	(t) => [
		uniqueIndex('recipe_version_n_idx').on(t.recipeId, t.n),
		index('recipe_version_status_idx').on(t.status)
	]
);

export const recipeLine = sqliteTable(
	'recipe_line',
	{
		id: id(),
		versionId: text('version_id')
			.notNull()
			.references(() => recipeVersion.id),
		/** Order of addition, from 1. */
		position: integer('position').notNull(),
		kind: text('kind').$type<LineKind>().notNull(),
		componentId: text('component_id').references(() => component.id),
		/** The form weighed when it differs from the component (MgSO4 given, MgSO4·7H2O weighed). */
		shelfFormId: text('shelf_form_id').references(() => component.id),
		stockRecipeId: text('stock_recipe_id').references(() => recipe.id),
		/** The stock's approved version this line uses, pinned when the version is submitted for review. */
		stockVersionId: text('stock_version_id').references(() => recipeVersion.id),
		amount: real('amount').notNull(),
		unit: text('unit').notNull(),
		tolerancePercent: real('tolerance_percent').notNull().default(2),
		note: text('note').notNull().default('')
	},
	(t) => [
		index('recipe_line_version_idx').on(t.versionId, t.position),
		index('recipe_line_component_idx').on(t.componentId)
	]
);

/**
 * Electronic signatures (21 CFR Part 11: printed name, date and time, meaning, linked to the record).
 * Generic over what is signed; append-only by trigger.
 */
export const eSignature = sqliteTable(
	'e_signature',
	{
		id: id(),
		signerId: text('signer_id')
			.notNull()
			.references(() => user.id),
		signerEmail: text('signer_email').notNull(),
		signerName: text('signer_name').notNull(),
		meaning: text('meaning').notNull(),
		subjectType: text('subject_type').notNull(),
		subjectId: text('subject_id').notNull(),
		/** SHA-256 of the signed content, so a signature stays tied to exactly what was shown. */
		subjectDigest: text('subject_digest'),
		comment: text('comment').notNull().default(''),
		signedAt: integer('signed_at', { mode: 'timestamp_ms' })
			.notNull()
			.$defaultFn(() => new Date()),
		...chainColumns()
	},
	(t) => [
		index('e_signature_subject_idx').on(t.subjectType, t.subjectId),
		uniqueIndex('e_signature_seq_idx').on(t.seq),
		uniqueIndex('e_signature_prev_hash_idx').on(t.prevHash)
	]
);

/** A component as a version's snapshot keeps it: the library row, times as ISO text. */
export type ComponentSnapshot = Omit<Component, 'createdAt' | 'updatedAt'> & {
	createdAt: string;
	updatedAt: string;
};

/**
 * What a version in review or approved weighs and computes with: each component its lines name, as
 * it was when the version was submitted. A later edit of the library never changes it; triggers
 * refuse UPDATE, and DELETE unless the version is back in draft.
 */
export const recipeVersionComponent = sqliteTable(
	'recipe_version_component',
	{
		versionId: text('version_id')
			.notNull()
			.references(() => recipeVersion.id),
		componentId: text('component_id')
			.notNull()
			.references(() => component.id),
		componentRevision: integer('component_revision').notNull(),
		data: text('data', { mode: 'json' }).$type<ComponentSnapshot>().notNull()
	},
	(t) => [primaryKey({ columns: [t.versionId, t.componentId] })]
);

/**
 * Everyone who changed a version, by any route: filled by triggers on `recipe_version` (its author
 * at creation, whoever bumps its revision), so no code path can leave an editor out. A trigger on
 * `e_signature` refuses a signature on a version from anyone listed here.
 */
export const recipeVersionEditor = sqliteTable(
	'recipe_version_editor',
	{
		versionId: text('version_id')
			.notNull()
			.references(() => recipeVersion.id),
		userId: text('user_id')
			.notNull()
			.references(() => user.id),
		firstAt: integer('first_at', { mode: 'timestamp_ms' })
			.notNull()
			.default(sql`(unixepoch() * 1000)`)
	},
	(t) => [primaryKey({ columns: [t.versionId, t.userId] })]
);

export type Component = typeof component.$inferSelect;
export type Recipe = typeof recipe.$inferSelect;
export type RecipeVersion = typeof recipeVersion.$inferSelect;
export type RecipeLine = typeof recipeLine.$inferSelect;
export type ESignature = typeof eSignature.$inferSelect;
