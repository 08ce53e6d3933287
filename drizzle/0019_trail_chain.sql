ALTER TABLE `audit_event` ADD `seq` integer;--> statement-breakpoint
ALTER TABLE `audit_event` ADD `prev_hash` text;--> statement-breakpoint
ALTER TABLE `audit_event` ADD `row_hash` text;--> statement-breakpoint
CREATE UNIQUE INDEX `audit_seq_idx` ON `audit_event` (`seq`);--> statement-breakpoint
CREATE UNIQUE INDEX `audit_prev_hash_idx` ON `audit_event` (`prev_hash`);--> statement-breakpoint
ALTER TABLE `e_signature` ADD `seq` integer;--> statement-breakpoint
ALTER TABLE `e_signature` ADD `prev_hash` text;--> statement-breakpoint
ALTER TABLE `e_signature` ADD `row_hash` text;--> statement-breakpoint
CREATE UNIQUE INDEX `e_signature_seq_idx` ON `e_signature` (`seq`);--> statement-breakpoint
CREATE UNIQUE INDEX `e_signature_prev_hash_idx` ON `e_signature` (`prev_hash`);