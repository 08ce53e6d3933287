import {
	index,
	integer,
	primaryKey,
	real,
	sqliteTable,
	text,
	uniqueIndex
} from 'drizzle-orm/sqlite-core';
import type { KlaMethod, KlaPowerSource } from '$lib/kla';
import type { RunBatchRole, RunState } from '$lib/runs/states';
import type { DissolvedOxygenUnit } from '$chemistry';
import { batch } from './batches.schema';
import { organismProfile, study, vessel } from './studies.schema';
import { user } from './schema';
import { createdAt, id } from './columns';

/** One measured kLa of a vessel at one agitation and gas flow: a point of the vessel's kLa map. */
export const vesselKlaPoint = sqliteTable(
	'vessel_kla_point',
	{
		id: id(),
		vesselId: text('vessel_id')
			.notNull()
			.references(() => vessel.id, { onDelete: 'cascade' }),
		measuredOn: text('measured_on').notNull(),
		method: text('method').$type<KlaMethod>().notNull(),
		agitationRpm: real('agitation_rpm').notNull(),
		gasFlowLPerMin: real('gas_flow_l_per_min').notNull(),
		liquidVolumeL: real('liquid_volume_l').notNull(),
		powerPerVolumeWPerM3: real('power_per_volume_w_per_m3').notNull(),
		/** measured (torque, wattmeter) or from the power number, speed and impeller diameter */
		powerSource: text('power_source').$type<KlaPowerSource>().notNull(),
		superficialVelocityMPerS: real('superficial_velocity_m_per_s').notNull(),
		temperatureC: real('temperature_c').notNull(),
		kLaPerH: real('kla_per_h').notNull(),
		/** the fit's 95 % interval; null for a value entered without one */
		kLaLowPerH: real('kla_low_per_h'),
		kLaHighPerH: real('kla_high_per_h'),
		probeTimeConstantS: real('probe_time_constant_s'),
		/** the DO curve the kLa was fitted to, kept so the fit can be shown and checked again */
		readings: text('readings', { mode: 'json' }).$type<{
			timeS: number[];
			dissolvedOxygen: number[];
			unit: DissolvedOxygenUnit;
		}>(),
		notes: text('notes').notNull().default(''),
		createdById: text('created_by_id')
			.notNull()
			.references(() => user.id),
		createdAt: createdAt()
	},
	(t) => [index('vessel_kla_point_vessel_idx').on(t.vesselId, t.measuredOn)]
);

/** A culture run: the plan it follows (a study), the vessel, the organism, the batches it used, its data. */
export const run = sqliteTable(
	'run',
	{
		id: id(),
		number: text('number').notNull().unique(),
		name: text('name').notNull(),
		studyId: text('study_id')
			.notNull()
			.references(() => study.id),
		vesselId: text('vessel_id')
			.notNull()
			.references(() => vessel.id),
		profileId: text('profile_id')
			.notNull()
			.references(() => organismProfile.id),
		startedAt: integer('started_at', { mode: 'timestamp_ms' }).notNull(),
		endedAt: integer('ended_at', { mode: 'timestamp_ms' }),
		state: text('state').$type<RunState>().notNull().default('open'),
		/** the conditions the controller's gas flows are stated at (standard litres: 0 °C, 101.325 kPa) */
		gasReferenceTemperatureC: real('gas_reference_temperature_c').notNull().default(0),
		gasReferencePressureKPa: real('gas_reference_pressure_kpa').notNull().default(101.325),
		/** who ran it, as written on the run form */
		people: text('people').notNull().default(''),
		notes: text('notes').notNull().default(''),
		createdById: text('created_by_id')
			.notNull()
			.references(() => user.id),
		revision: integer('revision').notNull().default(1),
		createdAt: createdAt()
	},
	(t) => [index('run_started_idx').on(t.startedAt), index('run_study_idx').on(t.studyId)]
);

/** A medium or feed batch a run used: the link from raw-material lots through batches to the run. */
export const runBatch = sqliteTable(
	'run_batch',
	{
		runId: text('run_id')
			.notNull()
			.references(() => run.id, { onDelete: 'cascade' }),
		batchId: text('batch_id')
			.notNull()
			.references(() => batch.id),
		role: text('role').$type<RunBatchRole>().notNull(),
		addedById: text('added_by_id')
			.notNull()
			.references(() => user.id),
		addedAt: createdAt()
	},
	(t) => [primaryKey({ columns: [t.runId, t.batchId] }), index('run_batch_batch_idx').on(t.batchId)]
);

/**
 * One signal of one run (DO, pH, exhaust O2 …). Its points carry this small integer key instead of
 * the run id and signal name, which keeps a 14-day run at one point per 10 s per signal small.
 */
export const runSeries = sqliteTable(
	'run_series',
	{
		key: integer('key').primaryKey({ autoIncrement: true }),
		runId: text('run_id')
			.notNull()
			.references(() => run.id, { onDelete: 'cascade' }),
		signal: text('signal').notNull()
	},
	(t) => [uniqueIndex('run_series_signal_idx').on(t.runId, t.signal)]
);

/** A reading: seconds from the run's start and the value in the signal's unit ($lib/runs/signals). */
export const runPoint = sqliteTable(
	'run_point',
	{
		seriesKey: integer('series_key')
			.notNull()
			.references(() => runSeries.key, { onDelete: 'cascade' }),
		timeS: real('time_s').notNull(),
		value: real('value').notNull()
	},
	(t) => [primaryKey({ columns: [t.seriesKey, t.timeS] })]
);

/** Every time a run has any reading at: the rows of its data table, paged and counted cheaply. */
export const runTime = sqliteTable(
	'run_time',
	{
		runId: text('run_id')
			.notNull()
			.references(() => run.id, { onDelete: 'cascade' }),
		timeS: real('time_s').notNull()
	},
	(t) => [primaryKey({ columns: [t.runId, t.timeS] })]
);

/** Each upload or push of data to a run: what came, from where, by whom. */
export const runUpload = sqliteTable(
	'run_upload',
	{
		id: id(),
		runId: text('run_id')
			.notNull()
			.references(() => run.id, { onDelete: 'cascade' }),
		source: text('source').$type<'csv' | 'api'>().notNull(),
		fileName: text('file_name'),
		rowCount: integer('row_count').notNull(),
		pointCount: integer('point_count').notNull(),
		/** points already stored with the same value, left as they were */
		unchangedCount: integer('unchanged_count').notNull().default(0),
		replacedCount: integer('replaced_count').notNull().default(0),
		signals: text('signals', { mode: 'json' }).$type<string[]>().notNull(),
		firstS: real('first_s'),
		lastS: real('last_s'),
		createdById: text('created_by_id')
			.notNull()
			.references(() => user.id),
		createdAt: createdAt()
	},
	(t) => [index('run_upload_run_idx').on(t.runId, t.createdAt)]
);

export type VesselKlaPointRow = typeof vesselKlaPoint.$inferSelect;
export type RunRow = typeof run.$inferSelect;
export type RunUploadRow = typeof runUpload.$inferSelect;
