CREATE TABLE `batch_recall_flag` (
	`id` text PRIMARY KEY NOT NULL,
	`recall_id` text NOT NULL,
	`batch_id` text NOT NULL,
	`depth` integer NOT NULL,
	`via_lot_code` text,
	FOREIGN KEY (`recall_id`) REFERENCES `lot_recall`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`batch_id`) REFERENCES `batch`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `batch_recall_flag_batch_idx` ON `batch_recall_flag` (`batch_id`);--> statement-breakpoint
CREATE TABLE `lot_recall` (
	`id` text PRIMARY KEY NOT NULL,
	`lot_id` text NOT NULL,
	`lot_action` text NOT NULL,
	`reason` text NOT NULL,
	`recalled_by_id` text NOT NULL,
	`signature_id` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`lot_id`) REFERENCES `lot`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recalled_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `lot_recall_lot_idx` ON `lot_recall` (`lot_id`);--> statement-breakpoint
ALTER TABLE `lot` ADD `retest_on` text;