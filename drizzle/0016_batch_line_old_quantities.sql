ALTER TABLE `batch_line` DROP COLUMN `required_quantity`;--> statement-breakpoint
ALTER TABLE `batch_line` DROP COLUMN `actual_quantity`;--> statement-breakpoint
ALTER TABLE `batch_line` DROP COLUMN `consumed_quantity`;