CREATE TABLE `organism_profile` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`group` text NOT NULL,
	`kind` text NOT NULL,
	`biomass_formula` text,
	`ash_fraction` real,
	`elemental_fractions` text,
	`fractions_source` text,
	`component_requirements` text,
	`per_cell_consumption` text,
	`cell_dry_mass_pg` real,
	`carbon_source_id` text,
	`yield_xs_g_per_g` real,
	`mu_max_per_h` real,
	`ks_g_per_l` real,
	`maintenance_g_per_gh` real,
	`yield_xo2_g_per_g` real,
	`qo2_mmol_per_gh` real,
	`notes` text DEFAULT '' NOT NULL,
	`is_demo` integer DEFAULT false NOT NULL,
	`revision` integer DEFAULT 1 NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `organism_profile_name_unique` ON `organism_profile` (`name`);--> statement-breakpoint
CREATE TABLE `study` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`basal_version_id` text NOT NULL,
	`profile_id` text NOT NULL,
	`vessel_id` text NOT NULL,
	`target_basis` text NOT NULL,
	`target_value` real NOT NULL,
	`initial_volume_l` real NOT NULL,
	`inoculum_density` real NOT NULL,
	`duration_h` real NOT NULL,
	`feed_strategy` text NOT NULL,
	`feed_start_h` real NOT NULL,
	`feed_mu_set_per_h` real,
	`temperature_c` real NOT NULL,
	`pressure_kpa` real NOT NULL,
	`o2_mole_fraction` real NOT NULL,
	`do_setpoint_percent` real NOT NULL,
	`safety_factor` real NOT NULL,
	`notes` text DEFAULT '' NOT NULL,
	`created_by_id` text NOT NULL,
	`revision` integer DEFAULT 1 NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`basal_version_id`) REFERENCES `recipe_version`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`profile_id`) REFERENCES `organism_profile`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`vessel_id`) REFERENCES `vessel`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `study_name_unique` ON `study` (`name`);--> statement-breakpoint
CREATE INDEX `study_basal_idx` ON `study` (`basal_version_id`);--> statement-breakpoint
CREATE TABLE `study_feed` (
	`id` text PRIMARY KEY NOT NULL,
	`study_id` text NOT NULL,
	`version_id` text NOT NULL,
	`position` integer NOT NULL,
	`volume_l` real NOT NULL,
	FOREIGN KEY (`study_id`) REFERENCES `study`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`version_id`) REFERENCES `recipe_version`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `study_feed_study_idx` ON `study_feed` (`study_id`,`position`);--> statement-breakpoint
CREATE INDEX `study_feed_version_idx` ON `study_feed` (`version_id`);--> statement-breakpoint
CREATE TABLE `vessel` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`min_working_volume_l` real NOT NULL,
	`max_working_volume_l` real NOT NULL,
	`kla_mode` text NOT NULL,
	`kla_per_h` real,
	`correlation_k` real,
	`correlation_a` real,
	`correlation_b` real,
	`power_per_volume_w_per_m3` real,
	`superficial_velocity_m_per_s` real,
	`max_gas_flow_vvm` real NOT NULL,
	`o2_enrichment_allowed` integer DEFAULT false NOT NULL,
	`max_pressure_kpa` real NOT NULL,
	`temperature_c` real NOT NULL,
	`cooling_capacity_w` real NOT NULL,
	`agitation_power_w` real,
	`notes` text DEFAULT '' NOT NULL,
	`is_demo` integer DEFAULT false NOT NULL,
	`revision` integer DEFAULT 1 NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `vessel_name_unique` ON `vessel` (`name`);