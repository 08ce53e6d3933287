CREATE TABLE `run` (
	`id` text PRIMARY KEY NOT NULL,
	`number` text NOT NULL,
	`name` text NOT NULL,
	`study_id` text NOT NULL,
	`vessel_id` text NOT NULL,
	`profile_id` text NOT NULL,
	`started_at` integer NOT NULL,
	`ended_at` integer,
	`state` text DEFAULT 'open' NOT NULL,
	`gas_reference_temperature_c` real DEFAULT 0 NOT NULL,
	`gas_reference_pressure_kpa` real DEFAULT 101.325 NOT NULL,
	`people` text DEFAULT '' NOT NULL,
	`notes` text DEFAULT '' NOT NULL,
	`created_by_id` text NOT NULL,
	`revision` integer DEFAULT 1 NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`study_id`) REFERENCES `study`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`vessel_id`) REFERENCES `vessel`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`profile_id`) REFERENCES `organism_profile`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `run_number_unique` ON `run` (`number`);--> statement-breakpoint
CREATE INDEX `run_started_idx` ON `run` (`started_at`);--> statement-breakpoint
CREATE INDEX `run_study_idx` ON `run` (`study_id`);--> statement-breakpoint
CREATE TABLE `run_batch` (
	`run_id` text NOT NULL,
	`batch_id` text NOT NULL,
	`role` text NOT NULL,
	`added_by_id` text NOT NULL,
	`created_at` integer NOT NULL,
	PRIMARY KEY(`run_id`, `batch_id`),
	FOREIGN KEY (`run_id`) REFERENCES `run`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`batch_id`) REFERENCES `batch`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`added_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `run_batch_batch_idx` ON `run_batch` (`batch_id`);--> statement-breakpoint
CREATE TABLE `run_point` (
	`series_key` integer NOT NULL,
	`time_s` real NOT NULL,
	`value` real NOT NULL,
	PRIMARY KEY(`series_key`, `time_s`),
	FOREIGN KEY (`series_key`) REFERENCES `run_series`(`key`) ON UPDATE no action ON DELETE cascade
) WITHOUT ROWID;
--> statement-breakpoint
CREATE TABLE `run_series` (
	`key` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`run_id` text NOT NULL,
	`signal` text NOT NULL,
	FOREIGN KEY (`run_id`) REFERENCES `run`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `run_series_signal_idx` ON `run_series` (`run_id`,`signal`);--> statement-breakpoint
CREATE TABLE `run_time` (
	`run_id` text NOT NULL,
	`time_s` real NOT NULL,
	PRIMARY KEY(`run_id`, `time_s`),
	FOREIGN KEY (`run_id`) REFERENCES `run`(`id`) ON UPDATE no action ON DELETE cascade
) WITHOUT ROWID;
--> statement-breakpoint
CREATE TABLE `run_upload` (
	`id` text PRIMARY KEY NOT NULL,
	`run_id` text NOT NULL,
	`source` text NOT NULL,
	`file_name` text,
	`row_count` integer NOT NULL,
	`point_count` integer NOT NULL,
	`unchanged_count` integer DEFAULT 0 NOT NULL,
	`replaced_count` integer DEFAULT 0 NOT NULL,
	`signals` text NOT NULL,
	`first_s` real,
	`last_s` real,
	`created_by_id` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`run_id`) REFERENCES `run`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `run_upload_run_idx` ON `run_upload` (`run_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `vessel_kla_point` (
	`id` text PRIMARY KEY NOT NULL,
	`vessel_id` text NOT NULL,
	`measured_on` text NOT NULL,
	`method` text NOT NULL,
	`agitation_rpm` real NOT NULL,
	`gas_flow_l_per_min` real NOT NULL,
	`liquid_volume_l` real NOT NULL,
	`power_per_volume_w_per_m3` real NOT NULL,
	`power_source` text NOT NULL,
	`superficial_velocity_m_per_s` real NOT NULL,
	`temperature_c` real NOT NULL,
	`kla_per_h` real NOT NULL,
	`kla_low_per_h` real,
	`kla_high_per_h` real,
	`probe_time_constant_s` real,
	`readings` text,
	`notes` text DEFAULT '' NOT NULL,
	`created_by_id` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`vessel_id`) REFERENCES `vessel`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `vessel_kla_point_vessel_idx` ON `vessel_kla_point` (`vessel_id`,`measured_on`);--> statement-breakpoint
ALTER TABLE `vessel` ADD `vessel_diameter_m` real;--> statement-breakpoint
ALTER TABLE `vessel` ADD `impeller_diameter_m` real;--> statement-breakpoint
ALTER TABLE `vessel` ADD `impeller_count` integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `vessel` ADD `power_number` real;--> statement-breakpoint
ALTER TABLE `vessel` ADD `planned_agitation_rpm` real;--> statement-breakpoint
ALTER TABLE `vessel` ADD `planned_gas_flow_l_per_min` real;