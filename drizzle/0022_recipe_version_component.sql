CREATE TABLE `recipe_version_component` (
	`version_id` text NOT NULL,
	`component_id` text NOT NULL,
	`component_revision` integer NOT NULL,
	`data` text NOT NULL,
	PRIMARY KEY(`version_id`, `component_id`),
	FOREIGN KEY (`version_id`) REFERENCES `recipe_version`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`component_id`) REFERENCES `component`(`id`) ON UPDATE no action ON DELETE no action
);
