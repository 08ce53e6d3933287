ALTER TABLE `organism_profile` ADD `yield_xs_method` text DEFAULT 'entered' NOT NULL;--> statement-breakpoint
ALTER TABLE `organism_profile` ADD `respiratory_quotient` real;--> statement-breakpoint
ALTER TABLE `organism_profile` ADD `substrate_yields` text DEFAULT '[]' NOT NULL;