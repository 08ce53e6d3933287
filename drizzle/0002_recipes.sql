CREATE TABLE `component` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`category` text NOT NULL,
	`formula` text,
	`molar_mass_g_per_mol` real,
	`cas_number` text,
	`elemental_mass_fractions` text,
	`fractions_note` text,
	`ions` text,
	`osmotic_coefficient` real,
	`osmotic_coefficient_source` text,
	`solubility` text,
	`ghs_hazards` text NOT NULL,
	`hazard_source` text,
	`storage` text DEFAULT '' NOT NULL,
	`basis_component_id` text,
	`synonyms` text NOT NULL,
	`from_reference` integer DEFAULT false NOT NULL,
	`reorder_level_g` real,
	`density_g_per_ml` real,
	`revision` integer DEFAULT 1 NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`basis_component_id`) REFERENCES `component`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `component_name_unique` ON `component` (`name`);--> statement-breakpoint
CREATE INDEX `component_category_idx` ON `component` (`category`);--> statement-breakpoint
CREATE TABLE `e_signature` (
	`id` text PRIMARY KEY NOT NULL,
	`signer_id` text NOT NULL,
	`signer_email` text NOT NULL,
	`signer_name` text NOT NULL,
	`meaning` text NOT NULL,
	`subject_type` text NOT NULL,
	`subject_id` text NOT NULL,
	`subject_digest` text,
	`comment` text DEFAULT '' NOT NULL,
	`signed_at` integer NOT NULL,
	FOREIGN KEY (`signer_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `e_signature_subject_idx` ON `e_signature` (`subject_type`,`subject_id`);--> statement-breakpoint
CREATE TABLE `recipe` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`kind` text NOT NULL,
	`owner_id` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`owner_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `recipe_name_unique` ON `recipe` (`name`);--> statement-breakpoint
CREATE TABLE `recipe_line` (
	`id` text PRIMARY KEY NOT NULL,
	`version_id` text NOT NULL,
	`position` integer NOT NULL,
	`kind` text NOT NULL,
	`component_id` text,
	`shelf_form_id` text,
	`stock_recipe_id` text,
	`stock_version_id` text,
	`amount` real NOT NULL,
	`unit` text NOT NULL,
	`tolerance_percent` real DEFAULT 2 NOT NULL,
	`note` text DEFAULT '' NOT NULL,
	FOREIGN KEY (`version_id`) REFERENCES `recipe_version`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`component_id`) REFERENCES `component`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`shelf_form_id`) REFERENCES `component`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`stock_recipe_id`) REFERENCES `recipe`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`stock_version_id`) REFERENCES `recipe_version`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `recipe_line_version_idx` ON `recipe_line` (`version_id`,`position`);--> statement-breakpoint
CREATE INDEX `recipe_line_component_idx` ON `recipe_line` (`component_id`);--> statement-breakpoint
CREATE TABLE `recipe_version` (
	`id` text PRIMARY KEY NOT NULL,
	`recipe_id` text NOT NULL,
	`n` integer NOT NULL,
	`status` text DEFAULT 'draft' NOT NULL,
	`author_id` text NOT NULL,
	`based_on_version_id` text,
	`target_ph` real,
	`osmolality_min_mosm_per_kg` real,
	`osmolality_max_mosm_per_kg` real,
	`preparation_temperature_c` real DEFAULT 25 NOT NULL,
	`shelf_life_days` integer,
	`storage` text DEFAULT '' NOT NULL,
	`instructions` text DEFAULT '' NOT NULL,
	`change_note` text DEFAULT '' NOT NULL,
	`revision` integer DEFAULT 1 NOT NULL,
	`updated_by_id` text,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	`submitted_at` integer,
	`approved_at` integer,
	`approved_by_id` text,
	`retired_at` integer,
	FOREIGN KEY (`recipe_id`) REFERENCES `recipe`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`author_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`based_on_version_id`) REFERENCES `recipe_version`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`updated_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`approved_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `recipe_version_n_idx` ON `recipe_version` (`recipe_id`,`n`);--> statement-breakpoint
CREATE INDEX `recipe_version_status_idx` ON `recipe_version` (`status`);