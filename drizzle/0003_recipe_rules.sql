-- Approved and retired recipe versions are immutable: the only change allowed is approved -> retired
-- (setting retired_at with it). Their lines cannot be added, changed or removed.
CREATE TRIGGER recipe_version_locked_update BEFORE UPDATE ON recipe_version
WHEN OLD.status IN ('approved', 'retired') AND (
	NOT (NEW.status = OLD.status OR (OLD.status = 'approved' AND NEW.status = 'retired'))
	OR (NEW.retired_at IS NOT OLD.retired_at AND NOT (OLD.status = 'approved' AND NEW.status = 'retired'))
	OR NEW.id IS NOT OLD.id
	OR NEW.recipe_id IS NOT OLD.recipe_id
	OR NEW.n IS NOT OLD.n
	OR NEW.author_id IS NOT OLD.author_id
	OR NEW.based_on_version_id IS NOT OLD.based_on_version_id
	OR NEW.target_ph IS NOT OLD.target_ph
	OR NEW.osmolality_min_mosm_per_kg IS NOT OLD.osmolality_min_mosm_per_kg
	OR NEW.osmolality_max_mosm_per_kg IS NOT OLD.osmolality_max_mosm_per_kg
	OR NEW.preparation_temperature_c IS NOT OLD.preparation_temperature_c
	OR NEW.shelf_life_days IS NOT OLD.shelf_life_days
	OR NEW.storage IS NOT OLD.storage
	OR NEW.instructions IS NOT OLD.instructions
	OR NEW.change_note IS NOT OLD.change_note
	OR NEW.revision IS NOT OLD.revision
	OR NEW.updated_by_id IS NOT OLD.updated_by_id
	OR NEW.created_at IS NOT OLD.created_at
	OR NEW.updated_at IS NOT OLD.updated_at
	OR NEW.submitted_at IS NOT OLD.submitted_at
	OR NEW.approved_at IS NOT OLD.approved_at
	OR NEW.approved_by_id IS NOT OLD.approved_by_id
)
BEGIN
	SELECT RAISE(ABORT, 'recipe_version is approved or retired and cannot change (only approved -> retired is allowed)');
END;
--> statement-breakpoint
CREATE TRIGGER recipe_version_locked_delete BEFORE DELETE ON recipe_version
WHEN OLD.status IN ('approved', 'retired')
BEGIN
	SELECT RAISE(ABORT, 'recipe_version is approved or retired and cannot be deleted');
END;
--> statement-breakpoint
CREATE TRIGGER recipe_line_locked_insert BEFORE INSERT ON recipe_line
WHEN (SELECT status FROM recipe_version WHERE id = NEW.version_id) IN ('approved', 'retired')
BEGIN
	SELECT RAISE(ABORT, 'recipe_line belongs to an approved or retired version: INSERT is refused');
END;
--> statement-breakpoint
CREATE TRIGGER recipe_line_locked_update BEFORE UPDATE ON recipe_line
WHEN (SELECT status FROM recipe_version WHERE id = OLD.version_id) IN ('approved', 'retired')
	OR (SELECT status FROM recipe_version WHERE id = NEW.version_id) IN ('approved', 'retired')
BEGIN
	SELECT RAISE(ABORT, 'recipe_line belongs to an approved or retired version: UPDATE is refused');
END;
--> statement-breakpoint
CREATE TRIGGER recipe_line_locked_delete BEFORE DELETE ON recipe_line
WHEN (SELECT status FROM recipe_version WHERE id = OLD.version_id) IN ('approved', 'retired')
BEGIN
	SELECT RAISE(ABORT, 'recipe_line belongs to an approved or retired version: DELETE is refused');
END;
--> statement-breakpoint
-- Signatures are history: they may be added, never rewritten or removed.
CREATE TRIGGER e_signature_no_update BEFORE UPDATE ON e_signature
BEGIN
	SELECT RAISE(ABORT, 'e_signature is append-only: UPDATE is refused');
END;
--> statement-breakpoint
CREATE TRIGGER e_signature_no_delete BEFORE DELETE ON e_signature
BEGIN
	SELECT RAISE(ABORT, 'e_signature is append-only: DELETE is refused');
END;
