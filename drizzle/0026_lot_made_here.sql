-- A lot may be a stock solution made here (source_batch_id) instead of a received component.
-- Rebuilt as SQLite asks for a column change; the database is opened with foreign keys off while
-- migrating and checked after (src/lib/server/db/index.ts). The lot's guards follow in 0027.
PRAGMA foreign_keys=OFF;--> statement-breakpoint
CREATE TABLE `__new_lot` (
	`id` text PRIMARY KEY NOT NULL,
	`code` text NOT NULL,
	`component_id` text,
	`source_batch_id` text,
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
	FOREIGN KEY (`source_batch_id`) REFERENCES `batch`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`status_changed_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`received_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
INSERT INTO `__new_lot`("id", "code", "component_id", "source_batch_id", "supplier", "supplier_lot", "quantity_kind", "received_quantity", "received_unit", "received_on", "expires_on", "date_kind", "storage", "assay_percent", "purity_percent", "water_content_percent", "status", "status_reason", "status_changed_at", "status_changed_by_id", "received_by_id", "note", "created_at") SELECT "id", "code", "component_id", NULL, "supplier", "supplier_lot", "quantity_kind", "received_quantity", "received_unit", "received_on", "expires_on", "date_kind", "storage", "assay_percent", "purity_percent", "water_content_percent", "status", "status_reason", "status_changed_at", "status_changed_by_id", "received_by_id", "note", "created_at" FROM `lot`;--> statement-breakpoint
DROP TABLE `lot`;--> statement-breakpoint
ALTER TABLE `__new_lot` RENAME TO `lot`;--> statement-breakpoint
PRAGMA foreign_keys=ON;--> statement-breakpoint
CREATE UNIQUE INDEX `lot_code_unique` ON `lot` (`code`);--> statement-breakpoint
CREATE UNIQUE INDEX `lot_supplier_lot_idx` ON `lot` (`component_id`,`supplier`,`supplier_lot`);--> statement-breakpoint
CREATE INDEX `lot_component_idx` ON `lot` (`component_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `lot_source_batch_idx` ON `lot` (`source_batch_id`);--> statement-breakpoint
CREATE INDEX `lot_status_idx` ON `lot` (`status`,`expires_on`);