import { index, integer, real, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import type { ElementStatements, PerCellConsumption } from '$chemistry';
import type {
	FeedPlanStrategy,
	VesselKlaMode,
	OrganismGroup,
	ProfileKind,
	SubstrateYieldEntry,
	TargetBasis,
	YieldMethod
} from '$lib/studies';
import { recipeVersion } from './recipes.schema';
import { user } from './schema';
import { createdAt, id } from './columns';

const updatedAt = () =>
	integer('updated_at', { mode: 'timestamp_ms' })
		.notNull()
		.$defaultFn(() => new Date());

/** What an organism needs and how it grows: the demand side of a study. */
export const organismProfile = sqliteTable('organism_profile', {
	id: id(),
	name: text('name').notNull().unique(),
	group: text('group').$type<OrganismGroup>().notNull(),
	kind: text('kind').$type<ProfileKind>().notNull(),
	biomassFormula: text('biomass_formula'),
	ashFraction: real('ash_fraction'),
	/** g element per g dry biomass. */
	elementalFractions: text('elemental_fractions', { mode: 'json' }).$type<Record<string, number>>(),
	/** Where the fractions come from: a published table (its citation) or the user's own analysis. */
	fractionsSource: text('fractions_source'),
	/**
	 * Per element: a role that overrides the default (required or trace) and how sure its value is,
	 * with its source. Null for profiles saved before elements carried it.
	 */
	elementStatements: text('element_statements', { mode: 'json' }).$type<ElementStatements>(),
	/** g component per g dry biomass. */
	componentRequirements: text('component_requirements', { mode: 'json' }).$type<
		Record<string, number>
	>(),
	perCellConsumption: text('per_cell_consumption', { mode: 'json' }).$type<PerCellConsumption[]>(),
	cellDryMassPg: real('cell_dry_mass_pg'),
	carbonSourceId: text('carbon_source_id'),
	/** Yx/s on the carbon source, g/g: entered, or worked out on save by the method below. */
	yieldXSGPerG: real('yield_xs_g_per_g'),
	yieldXSMethod: text('yield_xs_method').$type<YieldMethod>().notNull().default('entered'),
	/** mol CO2 per mol O2, measured; the element balance turns it into Yx/s. */
	respiratoryQuotient: real('respiratory_quotient'),
	/** Yields on further substrates (beyond the carbon source), entered or by element balance. */
	substrateYields: text('substrate_yields', { mode: 'json' })
		.$type<SubstrateYieldEntry[]>()
		.notNull()
		.default([]),
	muMaxPerH: real('mu_max_per_h'),
	ksGPerL: real('ks_g_per_l'),
	maintenanceGPerGH: real('maintenance_g_per_gh'),
	/** Yx/O2, g/g; when null, qO2 or the element balance gives the oxygen demand. */
	yieldXO2GPerG: real('yield_xo2_g_per_g'),
	qO2MmolPerGH: real('qo2_mmol_per_gh'),
	notes: text('notes').notNull().default(''),
	isDemo: integer('is_demo', { mode: 'boolean' }).notNull().default(false),
	revision: integer('revision').notNull().default(1),
	createdAt: createdAt(),
	updatedAt: updatedAt()
});

export const vessel = sqliteTable('vessel', {
	id: id(),
	name: text('name').notNull().unique(),
	minWorkingVolumeL: real('min_working_volume_l').notNull(),
	maxWorkingVolumeL: real('max_working_volume_l').notNull(),
	kLaMode: text('kla_mode').$type<VesselKlaMode>().notNull(),
	kLaPerH: real('kla_per_h'),
	/** kLa = k·(P/V)^a·(v_s)^b (van 't Riet 1979), P/V in W/m³, v_s in m/s; constants from the user. */
	correlationK: real('correlation_k'),
	correlationA: real('correlation_a'),
	correlationB: real('correlation_b'),
	powerPerVolumeWPerM3: real('power_per_volume_w_per_m3'),
	superficialVelocityMPerS: real('superficial_velocity_m_per_s'),
	maxGasFlowVvm: real('max_gas_flow_vvm').notNull(),
	o2EnrichmentAllowed: integer('o2_enrichment_allowed', { mode: 'boolean' })
		.notNull()
		.default(false),
	/** Absolute pressure rating of the headspace, kPa. */
	maxPressureKPa: real('max_pressure_kpa').notNull(),
	temperatureC: real('temperature_c').notNull(),
	coolingCapacityW: real('cooling_capacity_w').notNull(),
	agitationPowerW: real('agitation_power_w'),
	/** For the kLa map: the geometry that turns a stirrer speed into P/V and a gas flow into v_s. */
	vesselDiameterM: real('vessel_diameter_m'),
	impellerDiameterM: real('impeller_diameter_m'),
	impellerCount: integer('impeller_count').notNull().default(1),
	/** null: the common-practice default (chemistry/kla-correlation.ts RUSHTON_POWER_NUMBER) */
	powerNumber: real('power_number'),
	/** Where studies run the vessel: the map gives their kLa at this stirrer speed and gas flow. */
	plannedAgitationRpm: real('planned_agitation_rpm'),
	plannedGasFlowLPerMin: real('planned_gas_flow_l_per_min'),
	notes: text('notes').notNull().default(''),
	isDemo: integer('is_demo', { mode: 'boolean' }).notNull().default(false),
	revision: integer('revision').notNull().default(1),
	createdAt: createdAt(),
	updatedAt: updatedAt()
});

export const study = sqliteTable(
	'study',
	{
		id: id(),
		name: text('name').notNull().unique(),
		basalVersionId: text('basal_version_id')
			.notNull()
			.references(() => recipeVersion.id),
		profileId: text('profile_id')
			.notNull()
			.references(() => organismProfile.id),
		vesselId: text('vessel_id')
			.notNull()
			.references(() => vessel.id),
		targetBasis: text('target_basis').$type<TargetBasis>().notNull(),
		/** g/L dry biomass or cells/mL, by target_basis. */
		targetValue: real('target_value').notNull(),
		initialVolumeL: real('initial_volume_l').notNull(),
		/** Inoculum density in the same basis as the target. */
		inoculumDensity: real('inoculum_density').notNull(),
		durationH: real('duration_h').notNull(),
		temperatureC: real('temperature_c').notNull(),
		pressureKPa: real('pressure_kpa').notNull(),
		o2MoleFraction: real('o2_mole_fraction').notNull(),
		doSetpointPercent: real('do_setpoint_percent').notNull(),
		safetyFactor: real('safety_factor').notNull(),
		/** Oxycaloric factor, kJ per mol O2 consumed; null: the default of the science library, with its source. */
		heatPerMolO2KJ: real('heat_per_mol_o2_kj'),
		/** Where the plan runs the vessel, for a kLa from its measured map; null: the vessel's planned operation. */
		plannedAgitationRpm: real('planned_agitation_rpm'),
		plannedGasFlowLPerMin: real('planned_gas_flow_l_per_min'),
		notes: text('notes').notNull().default(''),
		createdById: text('created_by_id')
			.notNull()
			.references(() => user.id),
		revision: integer('revision').notNull().default(1),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [index('study_basal_idx').on(t.basalVersionId)]
);

export const studyFeed = sqliteTable(
	'study_feed',
	{
		id: id(),
		studyId: text('study_id')
			.notNull()
			.references(() => study.id, { onDelete: 'cascade' }),
		versionId: text('version_id')
			.notNull()
			.references(() => recipeVersion.id),
		position: integer('position').notNull(),
		/** Planned volume over the run, L; for a controlled plan (substrate- or DO-stat), the volume available. */
		volumeL: real('volume_l').notNull(),
		strategy: text('strategy').$type<FeedPlanStrategy>().notNull().default('constant'),
		startH: real('start_h').notNull().default(0),
		/** Exponential plan: the growth rate the feed is shaped for. */
		muSetPerH: real('mu_set_per_h'),
		/** Substrate-stat plan: the carbon source concentration it holds, g/L. */
		setpointGPerL: real('setpoint_g_per_l'),
		/** DO-stat plan: it feeds while DO is above this, % of air saturation. */
		doSetpointPercent: real('do_setpoint_percent'),
		/** Controlled plans: the pump's top rate, L/h. */
		maxRateLPerH: real('max_rate_l_per_h')
	},
	(t) => [
		index('study_feed_study_idx').on(t.studyId, t.position),
		index('study_feed_version_idx').on(t.versionId)
	]
);

export type OrganismProfileRow = typeof organismProfile.$inferSelect;
export type VesselRow = typeof vessel.$inferSelect;
export type StudyRow = typeof study.$inferSelect;
export type StudyFeedRow = typeof studyFeed.$inferSelect;
