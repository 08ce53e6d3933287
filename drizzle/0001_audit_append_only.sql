-- The audit trail is append-only: history may be added to, never rewritten or removed.
CREATE TRIGGER audit_event_no_update BEFORE UPDATE ON audit_event
BEGIN
	SELECT RAISE(ABORT, 'audit_event is append-only: UPDATE is refused');
END;
--> statement-breakpoint
CREATE TRIGGER audit_event_no_delete BEFORE DELETE ON audit_event
BEGIN
	SELECT RAISE(ABORT, 'audit_event is append-only: DELETE is refused');
END;
