DROP INDEX `stock_entry_lot_idx`;--> statement-breakpoint
CREATE INDEX `stock_entry_at_idx` ON `stock_entry` (`at`,`id`);--> statement-breakpoint
CREATE INDEX `stock_entry_lot_idx` ON `stock_entry` (`lot_id`,`at`,`id`);