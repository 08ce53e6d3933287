-- Corrections are history: added, never changed or removed.
CREATE TRIGGER batch_line_correction_no_update BEFORE UPDATE ON batch_line_correction
BEGIN
	SELECT RAISE(ABORT, 'batch_line_correction is append-only: UPDATE is refused');
END;
--> statement-breakpoint
CREATE TRIGGER batch_line_correction_no_delete BEFORE DELETE ON batch_line_correction
BEGIN
	SELECT RAISE(ABORT, 'batch_line_correction is append-only: DELETE is refused');
END;
--> statement-breakpoint
-- A line signed as done changes what went in only through a correction, which is written first.
CREATE TRIGGER batch_line_done_corrected_only BEFORE UPDATE ON batch_line
WHEN OLD.done_at IS NOT NULL
	AND (NEW.actual_text IS NOT OLD.actual_text OR NEW.actual_ug IS NOT OLD.actual_ug OR NEW.actual_ul IS NOT OLD.actual_ul)
	AND NOT EXISTS (
		SELECT 1 FROM batch_line_correction c
		WHERE c.line_id = OLD.id AND c.to_text = NEW.actual_text
			AND c.to_ug IS NEW.actual_ug AND c.to_ul IS NEW.actual_ul
			AND c.from_text = OLD.actual_text
	)
BEGIN
	SELECT RAISE(ABORT, 'batch_line: a line signed as done changes only through a signed correction');
END;
--> statement-breakpoint
-- Once prepared, the record is final but for corrections before review: what went in and what
-- the lot gave, nothing else.
DROP TRIGGER batch_line_locked;
--> statement-breakpoint
CREATE TRIGGER batch_line_locked BEFORE UPDATE ON batch_line
WHEN (SELECT state FROM batch WHERE id = OLD.batch_id) IN ('released', 'rejected')
	OR ((SELECT state FROM batch WHERE id = OLD.batch_id) = 'prepared' AND (
		NEW.id IS NOT OLD.id OR NEW.batch_id IS NOT OLD.batch_id OR NEW.position IS NOT OLD.position
		OR NEW.kind IS NOT OLD.kind OR NEW.recipe_line_id IS NOT OLD.recipe_line_id
		OR NEW.component_id IS NOT OLD.component_id OR NEW.stock_recipe_id IS NOT OLD.stock_recipe_id
		OR NEW.tolerance_percent IS NOT OLD.tolerance_percent OR NEW.lot_id IS NOT OLD.lot_id
		OR NEW.required_ug IS NOT OLD.required_ug OR NEW.required_ul IS NOT OLD.required_ul
		OR NEW.stock_source IS NOT OLD.stock_source OR NEW.done_by_id IS NOT OLD.done_by_id
		OR NEW.done_at IS NOT OLD.done_at
		OR NOT EXISTS (
			SELECT 1 FROM batch_line_correction c
			WHERE c.line_id = OLD.id AND c.to_text = NEW.actual_text
		)
	))
BEGIN
	SELECT RAISE(ABORT, 'batch_line: the batch is prepared; its record cannot change');
END;
