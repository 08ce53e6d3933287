CREATE TABLE `api_token` (
	`id` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`name` text NOT NULL,
	`user_id` text NOT NULL,
	`secret_hash` text NOT NULL,
	`scopes` text NOT NULL,
	`used_scopes` text DEFAULT '[]' NOT NULL,
	`requests_per_minute` integer NOT NULL,
	`created_at` integer NOT NULL,
	`created_by_id` text NOT NULL,
	`expires_at` integer NOT NULL,
	`last_used_at` integer,
	`last_used_address` text,
	`revoked_at` integer,
	`revoked_by_id` text,
	FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`revoked_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `api_token_user_idx` ON `api_token` (`user_id`);--> statement-breakpoint
ALTER TABLE `user` ADD `kind` text DEFAULT 'person' NOT NULL;