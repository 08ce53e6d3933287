CREATE TABLE `batch_line_correction` (
	`id` text PRIMARY KEY NOT NULL,
	`batch_id` text NOT NULL,
	`line_id` text NOT NULL,
	`from_text` text NOT NULL,
	`from_ug` integer,
	`from_ul` integer,
	`to_text` text NOT NULL,
	`to_ug` integer,
	`to_ul` integer,
	`reason` text NOT NULL,
	`corrected_by_id` text NOT NULL,
	`signature_id` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`batch_id`) REFERENCES `batch`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`line_id`) REFERENCES `batch_line`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`corrected_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `batch_line_correction_line_idx` ON `batch_line_correction` (`line_id`,`created_at`);