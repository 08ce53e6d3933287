CREATE TABLE `lot_material_name` (
	`lot_id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`code` text NOT NULL,
	FOREIGN KEY (`lot_id`) REFERENCES `lot`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `lot_material_name_order_idx` ON `lot_material_name` (`name`,`code`,`lot_id`);--> statement-breakpoint
-- A lot's material: its component's name; for a stock made here, its recipe's; else its own code.
INSERT INTO `lot_material_name` (`lot_id`, `name`, `code`)
SELECT l.id,
	coalesce(
		(SELECT c.name FROM component c WHERE c.id = l.component_id),
		(SELECT r.name FROM recipe r JOIN batch b ON b.recipe_id = r.id WHERE b.id = l.source_batch_id),
		l.code),
	l.code
FROM lot l;
--> statement-breakpoint
CREATE TRIGGER lot_material_name_start AFTER INSERT ON lot
BEGIN
	INSERT INTO lot_material_name (lot_id, name, code) VALUES (
		NEW.id,
		coalesce(
			(SELECT c.name FROM component c WHERE c.id = NEW.component_id),
			(SELECT r.name FROM recipe r JOIN batch b ON b.recipe_id = r.id WHERE b.id = NEW.source_batch_id),
			NEW.code),
		NEW.code);
END;
--> statement-breakpoint
CREATE TRIGGER lot_material_name_lot_changed AFTER UPDATE OF code, component_id, source_batch_id ON lot
BEGIN
	UPDATE lot_material_name SET
		name = coalesce(
			(SELECT c.name FROM component c WHERE c.id = NEW.component_id),
			(SELECT r.name FROM recipe r JOIN batch b ON b.recipe_id = r.id WHERE b.id = NEW.source_batch_id),
			NEW.code),
		code = NEW.code
	WHERE lot_id = NEW.id;
END;
--> statement-breakpoint
CREATE TRIGGER lot_material_name_component_renamed AFTER UPDATE OF name ON component
BEGIN
	UPDATE lot_material_name SET name = NEW.name
	WHERE lot_id IN (SELECT id FROM lot WHERE component_id = NEW.id);
END;
-- A stock made here is named after its recipe, whose name cannot change once a version was
-- reviewed (so before any batch of it): no trigger on recipe renames is needed.
