-- What the procedures forbid, the database refuses too, whatever client writes.

-- A batch moves only forward: planned → in preparation → prepared → released or rejected.
CREATE TRIGGER batch_state_forward BEFORE UPDATE OF state ON batch
WHEN NEW.state IS NOT OLD.state AND NOT (
	(OLD.state = 'planned' AND NEW.state = 'in_preparation')
	OR (OLD.state = 'in_preparation' AND NEW.state = 'prepared')
	OR (OLD.state = 'prepared' AND NEW.state IN ('released', 'rejected'))
)
BEGIN
	SELECT RAISE(ABORT, 'batch: this change of state is not allowed');
END;
--> statement-breakpoint
-- Who made it and from what never change; measurements change only while it is being made.
CREATE TRIGGER batch_identity_locked BEFORE UPDATE ON batch
WHEN NEW.id IS NOT OLD.id
	OR NEW.number IS NOT OLD.number
	OR NEW.number_year IS NOT OLD.number_year
	OR NEW.number_seq IS NOT OLD.number_seq
	OR NEW.recipe_id IS NOT OLD.recipe_id
	OR NEW.version_id IS NOT OLD.version_id
	OR NEW.created_by_id IS NOT OLD.created_by_id
	OR NEW.created_at IS NOT OLD.created_at
	OR (OLD.state <> 'planned' AND (
		NEW.target_volume_ml IS NOT OLD.target_volume_ml
		OR NEW.planned_on IS NOT OLD.planned_on
		OR NEW.intended_use IS NOT OLD.intended_use
		OR NEW.started_at IS NOT OLD.started_at
	))
BEGIN
	SELECT RAISE(ABORT, 'batch: its identity and plan cannot change once it is started');
END;
--> statement-breakpoint
-- Prepared, reviewed and released records are final; the one change allowed is the review itself.
CREATE TRIGGER batch_record_locked BEFORE UPDATE ON batch
WHEN OLD.state IN ('prepared', 'released', 'rejected') AND (
	NEW.prepared_by_id IS NOT OLD.prepared_by_id
	OR NEW.prepared_at IS NOT OLD.prepared_at
	OR NEW.measured_ph IS NOT OLD.measured_ph
	OR NEW.measured_osmolality_mosm_per_kg IS NOT OLD.measured_osmolality_mosm_per_kg
	OR (OLD.state <> 'prepared' AND (
		NEW.state IS NOT OLD.state
		OR NEW.reviewed_by_id IS NOT OLD.reviewed_by_id
		OR NEW.reviewed_at IS NOT OLD.reviewed_at
		OR NEW.review_note IS NOT OLD.review_note
	))
	OR (OLD.state = 'prepared' AND NEW.state = 'prepared' AND (
		NEW.reviewed_by_id IS NOT OLD.reviewed_by_id
		OR NEW.reviewed_at IS NOT OLD.reviewed_at
		OR NEW.review_note IS NOT OLD.review_note
	))
)
BEGIN
	SELECT RAISE(ABORT, 'batch: the record is prepared or reviewed and cannot change');
END;
--> statement-breakpoint
CREATE TRIGGER batch_no_delete BEFORE DELETE ON batch
BEGIN
	SELECT RAISE(ABORT, 'batch: batch records are kept and cannot be deleted');
END;
--> statement-breakpoint
-- A recipe's name and kind are part of what its versions' signatures cover.
CREATE TRIGGER recipe_name_locked BEFORE UPDATE ON recipe
WHEN (NEW.name IS NOT OLD.name OR NEW.kind IS NOT OLD.kind OR NEW.id IS NOT OLD.id)
	AND EXISTS (
		SELECT 1 FROM recipe_version
		WHERE recipe_id = OLD.id AND status IN ('in_review', 'approved', 'retired')
	)
BEGIN
	SELECT RAISE(ABORT, 'recipe: the name and kind of a recipe with a reviewed version cannot change');
END;
--> statement-breakpoint
CREATE TRIGGER recipe_no_delete BEFORE DELETE ON recipe
WHEN EXISTS (SELECT 1 FROM recipe_version WHERE recipe_id = OLD.id AND status <> 'draft')
BEGIN
	SELECT RAISE(ABORT, 'recipe: a recipe with a reviewed version cannot be deleted');
END;
--> statement-breakpoint
-- A lot's dates, source and quality figures are as received; its status moves only as allowed,
-- and each change says who made it and when.
CREATE TRIGGER lot_record_locked BEFORE UPDATE ON lot
WHEN NEW.supplier IS NOT OLD.supplier
	OR NEW.supplier_lot IS NOT OLD.supplier_lot
	OR NEW.received_unit IS NOT OLD.received_unit
	OR NEW.received_on IS NOT OLD.received_on
	OR NEW.expires_on IS NOT OLD.expires_on
	OR NEW.date_kind IS NOT OLD.date_kind
	OR NEW.assay_percent IS NOT OLD.assay_percent
	OR NEW.purity_percent IS NOT OLD.purity_percent
	OR NEW.water_content_percent IS NOT OLD.water_content_percent
BEGIN
	SELECT RAISE(ABORT, 'lot: its dates, source and quality figures are as received and cannot change');
END;
--> statement-breakpoint
CREATE TRIGGER lot_status_transition BEFORE UPDATE OF status ON lot
WHEN NEW.status IS NOT OLD.status AND (
	NOT (
		(OLD.status = 'quarantine' AND NEW.status IN ('released', 'rejected'))
		OR (OLD.status = 'released' AND NEW.status = 'rejected')
	)
	OR NEW.status_changed_by_id IS NULL
	OR NEW.status_changed_at IS OLD.status_changed_at
)
BEGIN
	SELECT RAISE(ABORT, 'lot: this change of status is not allowed');
END;
--> statement-breakpoint
-- A certificate once attached is evidence: a replacement is a new row, nothing is removed.
CREATE TRIGGER lot_certificate_no_update BEFORE UPDATE ON lot_certificate
BEGIN
	SELECT RAISE(ABORT, 'lot_certificate: an attached certificate cannot change; attach a new one');
END;
--> statement-breakpoint
CREATE TRIGGER lot_certificate_no_delete BEFORE DELETE ON lot_certificate
BEGIN
	SELECT RAISE(ABORT, 'lot_certificate: an attached certificate cannot be removed');
END;
