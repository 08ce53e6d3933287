-- batch_line's quantities move to columns that name their unit. The lock on prepared batches is lifted
-- for the copy only and put back exactly as drizzle/0005_ledger_rules.sql made it.
DROP TRIGGER batch_line_locked;
--> statement-breakpoint
UPDATE batch_line SET
	required_ug = CASE WHEN kind = 'component' THEN required_quantity END,
	required_ul = CASE WHEN kind = 'stock' THEN required_quantity END,
	actual_ug = CASE WHEN kind = 'component' THEN actual_quantity END,
	actual_ul = CASE WHEN kind = 'stock' THEN actual_quantity END,
	consumed_mg = CASE WHEN (SELECT quantity_kind FROM lot WHERE lot.id = batch_line.lot_id) = 'mass' THEN consumed_quantity END,
	consumed_ul = CASE WHEN (SELECT quantity_kind FROM lot WHERE lot.id = batch_line.lot_id) = 'volume' THEN consumed_quantity END;
--> statement-breakpoint
CREATE TRIGGER batch_line_locked BEFORE UPDATE ON batch_line
WHEN (SELECT state FROM batch WHERE id = OLD.batch_id) IN ('prepared', 'released', 'rejected')
BEGIN
	SELECT RAISE(ABORT, 'batch_line: the batch is prepared; its record cannot change');
END;
