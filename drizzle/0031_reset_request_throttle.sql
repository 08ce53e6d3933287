CREATE TABLE `reset_request` (
	`id` text PRIMARY KEY NOT NULL,
	`email` text NOT NULL,
	`address` text NOT NULL,
	`at` integer NOT NULL
);
--> statement-breakpoint
CREATE INDEX `reset_request_email_idx` ON `reset_request` (`email`,`at`);--> statement-breakpoint
CREATE INDEX `reset_request_address_idx` ON `reset_request` (`address`,`at`);