CREATE TABLE `lot_list_key` (
	`lot_id` text PRIMARY KEY NOT NULL,
	`material_name` text NOT NULL,
	`code` text NOT NULL,
	`status` text NOT NULL,
	FOREIGN KEY (`lot_id`) REFERENCES `lot`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `lot_list_key_material_idx` ON `lot_list_key` (`material_name`,`code`,`lot_id`);--> statement-breakpoint
CREATE INDEX `lot_list_key_status_material_idx` ON `lot_list_key` (`status`,`material_name`,`code`,`lot_id`);--> statement-breakpoint
DROP INDEX `stock_entry_lot_idx`;--> statement-breakpoint
CREATE INDEX `stock_entry_at_idx` ON `stock_entry` (`at`,`id`);--> statement-breakpoint
CREATE INDEX `stock_entry_lot_idx` ON `stock_entry` (`lot_id`,`at`,`id`);
--> statement-breakpoint
-- A lot's material: its component's name; for a stock made here, its recipe's; else its own code.
INSERT INTO `lot_list_key` (`lot_id`, `material_name`, `code`, `status`)
SELECT l.id,
	coalesce(
		(SELECT c.name FROM component c WHERE c.id = l.component_id),
		(SELECT r.name FROM recipe r JOIN batch b ON b.recipe_id = r.id WHERE b.id = l.source_batch_id),
		l.code),
	l.code,
	l.status
FROM lot l;
--> statement-breakpoint
CREATE TRIGGER lot_list_key_start AFTER INSERT ON lot
BEGIN
	INSERT INTO lot_list_key (lot_id, material_name, code, status) VALUES (
		NEW.id,
		coalesce(
			(SELECT c.name FROM component c WHERE c.id = NEW.component_id),
			(SELECT r.name FROM recipe r JOIN batch b ON b.recipe_id = r.id WHERE b.id = NEW.source_batch_id),
			NEW.code),
		NEW.code,
		NEW.status);
END;
--> statement-breakpoint
-- A lot's code, component and source stay as received (lot_identity_locked); its status moves.
CREATE TRIGGER lot_list_key_status AFTER UPDATE OF status ON lot
BEGIN
	UPDATE lot_list_key SET status = NEW.status WHERE lot_id = NEW.id;
END;
--> statement-breakpoint
-- A stock made here is named after its recipe, whose name cannot change once a version was
-- reviewed (so before any batch of it); a component's name can.
CREATE TRIGGER lot_list_key_component_renamed AFTER UPDATE OF name ON component
BEGIN
	UPDATE lot_list_key SET material_name = NEW.name
	WHERE lot_id IN (SELECT id FROM lot WHERE component_id = NEW.id);
END;
