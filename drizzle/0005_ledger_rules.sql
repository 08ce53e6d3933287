-- The stock ledger is history: entries may be added, never rewritten or removed.
CREATE TRIGGER stock_entry_no_update BEFORE UPDATE ON stock_entry
BEGIN
	SELECT RAISE(ABORT, 'stock_entry is append-only: UPDATE is refused');
END;
--> statement-breakpoint
CREATE TRIGGER stock_entry_no_delete BEFORE DELETE ON stock_entry
BEGIN
	SELECT RAISE(ABORT, 'stock_entry is append-only: DELETE is refused');
END;
--> statement-breakpoint
-- Each kind of entry has its sign: receipts add, consumption and disposal take, adjustments carry a reason.
CREATE TRIGGER stock_entry_sign BEFORE INSERT ON stock_entry
WHEN NEW.quantity = 0
	OR (NEW.kind = 'receipt' AND NEW.quantity < 0)
	OR (NEW.kind IN ('consumption', 'disposal') AND NEW.quantity > 0)
	OR (NEW.kind IN ('adjustment', 'disposal') AND trim(NEW.reason) = '')
	OR NEW.kind NOT IN ('receipt', 'consumption', 'adjustment', 'disposal')
	OR typeof(NEW.quantity) <> 'integer'
BEGIN
	SELECT RAISE(ABORT, 'stock_entry: the quantity sign or reason does not fit the kind of entry');
END;
--> statement-breakpoint
-- On-hand is the sum of the ledger; no entry may take it below zero.
CREATE TRIGGER stock_entry_not_negative BEFORE INSERT ON stock_entry
WHEN (SELECT COALESCE(SUM(quantity), 0) FROM stock_entry WHERE lot_id = NEW.lot_id) + NEW.quantity < 0
BEGIN
	SELECT RAISE(ABORT, 'stock_entry: this would make the lot''s on-hand negative');
END;
--> statement-breakpoint
-- What a lot is and where it came from stays as received; only its status (and the note) may change.
CREATE TRIGGER lot_identity_locked BEFORE UPDATE ON lot
WHEN NEW.id IS NOT OLD.id
	OR NEW.code IS NOT OLD.code
	OR NEW.component_id IS NOT OLD.component_id
	OR NEW.quantity_kind IS NOT OLD.quantity_kind
	OR NEW.received_quantity IS NOT OLD.received_quantity
	OR NEW.received_by_id IS NOT OLD.received_by_id
	OR NEW.created_at IS NOT OLD.created_at
BEGIN
	SELECT RAISE(ABORT, 'lot: identity, component and received quantity cannot change');
END;
--> statement-breakpoint
CREATE TRIGGER lot_no_delete BEFORE DELETE ON lot
BEGIN
	SELECT RAISE(ABORT, 'lot: lots are kept for traceability and cannot be deleted');
END;
--> statement-breakpoint
CREATE TRIGGER batch_deviation_no_update BEFORE UPDATE ON batch_deviation
BEGIN
	SELECT RAISE(ABORT, 'batch_deviation is append-only: UPDATE is refused');
END;
--> statement-breakpoint
CREATE TRIGGER batch_deviation_no_delete BEFORE DELETE ON batch_deviation
BEGIN
	SELECT RAISE(ABORT, 'batch_deviation is append-only: DELETE is refused');
END;
--> statement-breakpoint
-- A batch's record is closed once it is prepared: its lines cannot change after that.
CREATE TRIGGER batch_line_locked BEFORE UPDATE ON batch_line
WHEN (SELECT state FROM batch WHERE id = OLD.batch_id) IN ('prepared', 'released', 'rejected')
BEGIN
	SELECT RAISE(ABORT, 'batch_line: the batch is prepared; its record cannot change');
END;
--> statement-breakpoint
CREATE TRIGGER batch_line_no_delete BEFORE DELETE ON batch_line
BEGIN
	SELECT RAISE(ABORT, 'batch_line: lines of a batch record cannot be deleted');
END;
