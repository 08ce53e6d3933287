ALTER TABLE `batch_line` ADD `required_ug` integer;--> statement-breakpoint
ALTER TABLE `batch_line` ADD `required_ul` integer;--> statement-breakpoint
ALTER TABLE `batch_line` ADD `actual_ug` integer;--> statement-breakpoint
ALTER TABLE `batch_line` ADD `actual_ul` integer;--> statement-breakpoint
ALTER TABLE `batch_line` ADD `consumed_mg` integer;--> statement-breakpoint
ALTER TABLE `batch_line` ADD `consumed_ul` integer;