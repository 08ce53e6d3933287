ALTER TABLE `study` DROP COLUMN `feed_strategy`;--> statement-breakpoint
ALTER TABLE `study` DROP COLUMN `feed_start_h`;--> statement-breakpoint
ALTER TABLE `study` DROP COLUMN `feed_mu_set_per_h`;