CREATE TABLE `simulation_scenario` (
	`id` text PRIMARY KEY NOT NULL,
	`owner_id` text NOT NULL,
	`name` text NOT NULL,
	`mode` text NOT NULL,
	`request` text NOT NULL,
	`notes` text,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`owner_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `scenario_owner_name_idx` ON `simulation_scenario` (`owner_id`,`name`);--> statement-breakpoint
CREATE INDEX `scenario_owner_updated_idx` ON `simulation_scenario` (`owner_id`,`updated_at`);