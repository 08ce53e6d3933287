-- The lot's guards, again after its rebuild in 0026, and a lot is either received (a component)
-- or made here (a stock-solution batch), never both or neither.
CREATE TRIGGER lot_identity_locked BEFORE UPDATE ON lot
WHEN NEW.id IS NOT OLD.id
	OR NEW.code IS NOT OLD.code
	OR NEW.component_id IS NOT OLD.component_id
	OR NEW.source_batch_id IS NOT OLD.source_batch_id
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
CREATE TRIGGER lot_received_or_made BEFORE INSERT ON lot
WHEN (NEW.component_id IS NULL) = (NEW.source_batch_id IS NULL)
	OR (NEW.source_batch_id IS NOT NULL AND NEW.quantity_kind <> 'volume')
BEGIN
	SELECT RAISE(ABORT, 'lot: a lot is a received component or a stock made here, kept by volume');
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
