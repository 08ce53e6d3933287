-- Recalls and their flags are history: added, never changed or removed.
CREATE TRIGGER lot_recall_no_update BEFORE UPDATE ON lot_recall
BEGIN
	SELECT RAISE(ABORT, 'lot_recall is append-only: UPDATE is refused');
END;
--> statement-breakpoint
CREATE TRIGGER lot_recall_no_delete BEFORE DELETE ON lot_recall
BEGIN
	SELECT RAISE(ABORT, 'lot_recall is append-only: DELETE is refused');
END;
--> statement-breakpoint
CREATE TRIGGER batch_recall_flag_no_update BEFORE UPDATE ON batch_recall_flag
BEGIN
	SELECT RAISE(ABORT, 'batch_recall_flag is append-only: UPDATE is refused');
END;
--> statement-breakpoint
CREATE TRIGGER batch_recall_flag_no_delete BEFORE DELETE ON batch_recall_flag
BEGIN
	SELECT RAISE(ABORT, 'batch_recall_flag is append-only: DELETE is refused');
END;
--> statement-breakpoint
-- A recall may send a released lot back to quarantine (on hold); the rest as before.
DROP TRIGGER lot_status_transition;
--> statement-breakpoint
CREATE TRIGGER lot_status_transition BEFORE UPDATE OF status ON lot
WHEN NEW.status IS NOT OLD.status AND (
	NOT (
		(OLD.status = 'quarantine' AND NEW.status IN ('released', 'rejected'))
		OR (OLD.status = 'released' AND NEW.status IN ('rejected', 'quarantine'))
	)
	OR NEW.status_changed_by_id IS NULL
	OR NEW.status_changed_at IS OLD.status_changed_at
)
BEGIN
	SELECT RAISE(ABORT, 'lot: this change of status is not allowed');
END;
--> statement-breakpoint
-- A retest date is set by a recall or a signed retest, and only moves forward after a retest.
CREATE TRIGGER lot_retest_recorded BEFORE UPDATE OF retest_on ON lot
WHEN NEW.retest_on IS NOT OLD.retest_on
	AND NOT EXISTS (
		SELECT 1 FROM audit_event
		WHERE subject_type = 'lot' AND subject_id = OLD.id
			AND action IN ('lot.recalled', 'lot.retested')
			AND json_extract(detail, '$.retestOn') IS NEW.retest_on
	)
BEGIN
	SELECT RAISE(ABORT, 'lot: a retest date changes only through a recall or a signed retest');
END;
