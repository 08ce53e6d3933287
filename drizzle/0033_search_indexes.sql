-- Search over lots and batches through trigram full-text indexes (SQLite FTS5): a term of three or
-- more characters is found anywhere in a field, case-insensitively, without scanning every row.
-- Each index row names its record by id (not rowid, which VACUUM may renumber); triggers keep the
-- indexes in step with the tables they index.
CREATE VIRTUAL TABLE lot_search USING fts5(lot_id UNINDEXED, code, supplier, supplier_lot, component_name, tokenize = 'trigram');
--> statement-breakpoint
INSERT INTO lot_search (lot_id, code, supplier, supplier_lot, component_name)
SELECT lot.id, lot.code, lot.supplier, lot.supplier_lot, coalesce(component.name, '')
FROM lot LEFT JOIN component ON component.id = lot.component_id;
--> statement-breakpoint
CREATE TRIGGER lot_search_insert AFTER INSERT ON lot
BEGIN
	INSERT INTO lot_search (lot_id, code, supplier, supplier_lot, component_name)
	VALUES (NEW.id, NEW.code, NEW.supplier, NEW.supplier_lot, coalesce((SELECT name FROM component WHERE id = NEW.component_id), ''));
END;
--> statement-breakpoint
CREATE TRIGGER lot_search_update AFTER UPDATE OF code, supplier, supplier_lot, component_id ON lot
BEGIN
	DELETE FROM lot_search WHERE lot_id = OLD.id;
	INSERT INTO lot_search (lot_id, code, supplier, supplier_lot, component_name)
	VALUES (NEW.id, NEW.code, NEW.supplier, NEW.supplier_lot, coalesce((SELECT name FROM component WHERE id = NEW.component_id), ''));
END;
--> statement-breakpoint
CREATE TRIGGER lot_search_delete AFTER DELETE ON lot
BEGIN
	DELETE FROM lot_search WHERE lot_id = OLD.id;
END;
--> statement-breakpoint
CREATE TRIGGER lot_search_component_renamed AFTER UPDATE OF name ON component
BEGIN
	UPDATE lot_search SET component_name = NEW.name
	WHERE lot_id IN (SELECT id FROM lot WHERE component_id = NEW.id);
END;
--> statement-breakpoint
CREATE VIRTUAL TABLE batch_search USING fts5(batch_id UNINDEXED, number, recipe_name, intended_use, tokenize = 'trigram');
--> statement-breakpoint
INSERT INTO batch_search (batch_id, number, recipe_name, intended_use)
SELECT batch.id, batch.number, recipe.name, batch.intended_use
FROM batch JOIN recipe ON recipe.id = batch.recipe_id;
--> statement-breakpoint
CREATE TRIGGER batch_search_insert AFTER INSERT ON batch
BEGIN
	INSERT INTO batch_search (batch_id, number, recipe_name, intended_use)
	VALUES (NEW.id, NEW.number, coalesce((SELECT name FROM recipe WHERE id = NEW.recipe_id), ''), NEW.intended_use);
END;
--> statement-breakpoint
CREATE TRIGGER batch_search_update AFTER UPDATE OF number, recipe_id, intended_use ON batch
BEGIN
	DELETE FROM batch_search WHERE batch_id = OLD.id;
	INSERT INTO batch_search (batch_id, number, recipe_name, intended_use)
	VALUES (NEW.id, NEW.number, coalesce((SELECT name FROM recipe WHERE id = NEW.recipe_id), ''), NEW.intended_use);
END;
--> statement-breakpoint
CREATE TRIGGER batch_search_delete AFTER DELETE ON batch
BEGIN
	DELETE FROM batch_search WHERE batch_id = OLD.id;
END;
--> statement-breakpoint
CREATE TRIGGER batch_search_recipe_renamed AFTER UPDATE OF name ON recipe
BEGIN
	UPDATE batch_search SET recipe_name = NEW.name
	WHERE batch_id IN (SELECT id FROM batch WHERE recipe_id = NEW.id);
END;
