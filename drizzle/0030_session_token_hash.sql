-- Sessions from before are keyed by the token itself and expire in seconds: they are dropped (people sign in
-- again), which also lets the new NOT NULL column be added to an empty table.
DELETE FROM `session`;--> statement-breakpoint
ALTER TABLE `session` ADD `created_at` integer NOT NULL;
