-- Start-up seals rows written before the trail was chained (row_hash IS NULL). These partial indexes
-- hold only such rows, so the look at start-up reads nothing once all are sealed, whatever the size.
CREATE INDEX audit_event_unsealed_idx ON audit_event (seq) WHERE row_hash IS NULL;
--> statement-breakpoint
CREATE INDEX e_signature_unsealed_idx ON e_signature (seq) WHERE row_hash IS NULL;
