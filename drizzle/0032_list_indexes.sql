CREATE INDEX `audit_subject_idx` ON `audit_event` (`subject_type`,`subject_id`,`at`);--> statement-breakpoint
CREATE INDEX `lot_expiry_idx` ON `lot` (`expires_on`,`code`);--> statement-breakpoint
CREATE INDEX `stock_entry_lot_quantity_idx` ON `stock_entry` (`lot_id`,`quantity`);--> statement-breakpoint
CREATE INDEX `batch_planned_idx` ON `batch` (`planned_on`,`number`);