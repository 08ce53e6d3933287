CREATE TABLE `lot` (
	`id` text PRIMARY KEY NOT NULL,
	`code` text NOT NULL,
	`component_id` text NOT NULL,
	`supplier` text NOT NULL,
	`supplier_lot` text NOT NULL,
	`quantity_kind` text NOT NULL,
	`received_quantity` integer NOT NULL,
	`received_unit` text NOT NULL,
	`received_on` text NOT NULL,
	`expires_on` text NOT NULL,
	`date_kind` text DEFAULT 'expiry' NOT NULL,
	`storage` text DEFAULT '' NOT NULL,
	`assay_percent` real,
	`purity_percent` real,
	`water_content_percent` real,
	`status` text DEFAULT 'quarantine' NOT NULL,
	`status_reason` text DEFAULT '' NOT NULL,
	`status_changed_at` integer,
	`status_changed_by_id` text,
	`received_by_id` text NOT NULL,
	`note` text DEFAULT '' NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`component_id`) REFERENCES `component`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`status_changed_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`received_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `lot_code_unique` ON `lot` (`code`);--> statement-breakpoint
CREATE UNIQUE INDEX `lot_supplier_lot_idx` ON `lot` (`component_id`,`supplier`,`supplier_lot`);--> statement-breakpoint
CREATE INDEX `lot_component_idx` ON `lot` (`component_id`);--> statement-breakpoint
CREATE INDEX `lot_status_idx` ON `lot` (`status`,`expires_on`);--> statement-breakpoint
CREATE TABLE `lot_certificate` (
	`id` text PRIMARY KEY NOT NULL,
	`lot_id` text NOT NULL,
	`stored_name` text NOT NULL,
	`display_name` text NOT NULL,
	`media_type` text NOT NULL,
	`size_bytes` integer NOT NULL,
	`sha256` text NOT NULL,
	`uploaded_by_id` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`lot_id`) REFERENCES `lot`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`uploaded_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `lot_certificate_stored_name_unique` ON `lot_certificate` (`stored_name`);--> statement-breakpoint
CREATE INDEX `lot_certificate_lot_idx` ON `lot_certificate` (`lot_id`);--> statement-breakpoint
CREATE TABLE `stock_entry` (
	`id` text PRIMARY KEY NOT NULL,
	`lot_id` text NOT NULL,
	`kind` text NOT NULL,
	`quantity` integer NOT NULL,
	`reason` text DEFAULT '' NOT NULL,
	`batch_id` text,
	`actor_id` text,
	`at` integer NOT NULL,
	FOREIGN KEY (`lot_id`) REFERENCES `lot`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`actor_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `stock_entry_lot_idx` ON `stock_entry` (`lot_id`,`at`);--> statement-breakpoint
CREATE INDEX `stock_entry_batch_idx` ON `stock_entry` (`batch_id`);--> statement-breakpoint
CREATE TABLE `batch` (
	`id` text PRIMARY KEY NOT NULL,
	`number` text NOT NULL,
	`number_year` integer NOT NULL,
	`number_seq` integer NOT NULL,
	`recipe_id` text NOT NULL,
	`version_id` text NOT NULL,
	`target_volume_ml` integer NOT NULL,
	`planned_on` text NOT NULL,
	`intended_use` text NOT NULL,
	`state` text DEFAULT 'planned' NOT NULL,
	`created_by_id` text NOT NULL,
	`prepared_by_id` text,
	`started_at` integer,
	`prepared_at` integer,
	`measured_ph` real,
	`measured_osmolality_mosm_per_kg` real,
	`reviewed_by_id` text,
	`reviewed_at` integer,
	`review_note` text DEFAULT '' NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`recipe_id`) REFERENCES `recipe`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`version_id`) REFERENCES `recipe_version`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`prepared_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`reviewed_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `batch_number_unique` ON `batch` (`number`);--> statement-breakpoint
CREATE INDEX `batch_state_idx` ON `batch` (`state`,`planned_on`);--> statement-breakpoint
CREATE INDEX `batch_recipe_idx` ON `batch` (`recipe_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `batch_number_seq_idx` ON `batch` (`number_year`,`number_seq`);--> statement-breakpoint
CREATE TABLE `batch_deviation` (
	`id` text PRIMARY KEY NOT NULL,
	`batch_id` text NOT NULL,
	`line_id` text,
	`kind` text NOT NULL,
	`detail` text NOT NULL,
	`reason` text NOT NULL,
	`recorded_by_id` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`batch_id`) REFERENCES `batch`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`line_id`) REFERENCES `batch_line`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recorded_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `batch_deviation_batch_idx` ON `batch_deviation` (`batch_id`);--> statement-breakpoint
CREATE TABLE `batch_line` (
	`id` text PRIMARY KEY NOT NULL,
	`batch_id` text NOT NULL,
	`position` integer NOT NULL,
	`kind` text NOT NULL,
	`recipe_line_id` text NOT NULL,
	`component_id` text,
	`stock_recipe_id` text,
	`tolerance_percent` real NOT NULL,
	`lot_id` text,
	`required_quantity` integer,
	`actual_quantity` integer,
	`actual_text` text,
	`consumed_quantity` integer,
	`stock_source` text DEFAULT '' NOT NULL,
	`done_by_id` text,
	`done_at` integer,
	FOREIGN KEY (`batch_id`) REFERENCES `batch`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recipe_line_id`) REFERENCES `recipe_line`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`component_id`) REFERENCES `component`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`stock_recipe_id`) REFERENCES `recipe`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`lot_id`) REFERENCES `lot`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`done_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `batch_line_batch_idx` ON `batch_line` (`batch_id`,`position`);--> statement-breakpoint
CREATE INDEX `batch_line_lot_idx` ON `batch_line` (`lot_id`);