CREATE TABLE `recipe_version_editor` (
	`version_id` text NOT NULL,
	`user_id` text NOT NULL,
	`first_at` integer DEFAULT (unixepoch() * 1000) NOT NULL,
	PRIMARY KEY(`version_id`, `user_id`),
	FOREIGN KEY (`version_id`) REFERENCES `recipe_version`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
