ALTER TABLE `study_feed` ADD `strategy` text DEFAULT 'constant' NOT NULL;--> statement-breakpoint
ALTER TABLE `study_feed` ADD `start_h` real DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `study_feed` ADD `mu_set_per_h` real;--> statement-breakpoint
ALTER TABLE `study_feed` ADD `setpoint_g_per_l` real;--> statement-breakpoint
ALTER TABLE `study_feed` ADD `do_setpoint_percent` real;--> statement-breakpoint
ALTER TABLE `study_feed` ADD `max_rate_l_per_h` real;