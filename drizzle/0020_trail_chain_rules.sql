-- The audit trail and the signatures are chained: each row carries the hash of its content and of
-- the row before it (src/lib/server/trail/chain.ts computes it; `npm run verify-trail` checks it).
-- Rows written before the chain get their order here and their hashes once, at start-up.
DROP TRIGGER audit_event_no_update;
--> statement-breakpoint
UPDATE audit_event SET seq = ordered.n
FROM (SELECT id, row_number() OVER (ORDER BY at, rowid) AS n FROM audit_event) AS ordered
WHERE ordered.id = audit_event.id;
--> statement-breakpoint
-- Still append-only; the one change allowed is sealing a row written before the chain.
CREATE TRIGGER audit_event_no_update BEFORE UPDATE ON audit_event
WHEN NOT (OLD.row_hash IS NULL AND NEW.row_hash IS NOT NULL AND NEW.id IS OLD.id AND NEW.at IS OLD.at AND NEW.actor_id IS OLD.actor_id AND NEW.actor_email IS OLD.actor_email AND NEW.action IS OLD.action AND NEW.subject_type IS OLD.subject_type AND NEW.subject_id IS OLD.subject_id AND NEW.detail IS OLD.detail AND NEW.address IS OLD.address AND NEW.seq IS OLD.seq)
BEGIN
	SELECT RAISE(ABORT, 'audit_event is append-only: UPDATE is refused');
END;
--> statement-breakpoint
-- A new row continues the chain: the next number, the last row's hash, a hash of its own.
CREATE TRIGGER audit_event_chained BEFORE INSERT ON audit_event
WHEN NEW.seq IS NOT (SELECT COALESCE(MAX(seq), 0) + 1 FROM audit_event)
	OR NEW.prev_hash IS NOT (SELECT row_hash FROM audit_event ORDER BY seq DESC LIMIT 1)
	OR NEW.row_hash IS NULL OR length(NEW.row_hash) <> 64
BEGIN
	SELECT RAISE(ABORT, 'audit_event: a new row must continue the chain (seq, prev_hash, row_hash)');
END;
--> statement-breakpoint
DROP TRIGGER e_signature_no_update;
--> statement-breakpoint
UPDATE e_signature SET seq = ordered.n
FROM (SELECT id, row_number() OVER (ORDER BY signed_at, rowid) AS n FROM e_signature) AS ordered
WHERE ordered.id = e_signature.id;
--> statement-breakpoint
-- Still append-only; the one change allowed is sealing a row written before the chain.
CREATE TRIGGER e_signature_no_update BEFORE UPDATE ON e_signature
WHEN NOT (OLD.row_hash IS NULL AND NEW.row_hash IS NOT NULL AND NEW.id IS OLD.id AND NEW.signer_id IS OLD.signer_id AND NEW.signer_email IS OLD.signer_email AND NEW.signer_name IS OLD.signer_name AND NEW.meaning IS OLD.meaning AND NEW.subject_type IS OLD.subject_type AND NEW.subject_id IS OLD.subject_id AND NEW.subject_digest IS OLD.subject_digest AND NEW.comment IS OLD.comment AND NEW.signed_at IS OLD.signed_at AND NEW.seq IS OLD.seq)
BEGIN
	SELECT RAISE(ABORT, 'e_signature is append-only: UPDATE is refused');
END;
--> statement-breakpoint
-- A new row continues the chain: the next number, the last row's hash, a hash of its own.
CREATE TRIGGER e_signature_chained BEFORE INSERT ON e_signature
WHEN NEW.seq IS NOT (SELECT COALESCE(MAX(seq), 0) + 1 FROM e_signature)
	OR NEW.prev_hash IS NOT (SELECT row_hash FROM e_signature ORDER BY seq DESC LIMIT 1)
	OR NEW.row_hash IS NULL OR length(NEW.row_hash) <> 64
BEGIN
	SELECT RAISE(ABORT, 'e_signature: a new row must continue the chain (seq, prev_hash, row_hash)');
END;
