CREATE TABLE `lot_on_hand` (
	`lot_id` text PRIMARY KEY NOT NULL,
	`quantity` integer NOT NULL,
	FOREIGN KEY (`lot_id`) REFERENCES `lot`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `lot_on_hand_quantity_idx` ON `lot_on_hand` (`quantity`,`lot_id`);--> statement-breakpoint
INSERT INTO `lot_on_hand` (`lot_id`, `quantity`)
SELECT `lot_id`, SUM(`quantity`) FROM `stock_entry` GROUP BY `lot_id`;
--> statement-breakpoint
-- The ledger is append-only (0005), so adding each new entry keeps the sum exact.
CREATE TRIGGER stock_entry_on_hand AFTER INSERT ON stock_entry
BEGIN
	INSERT INTO lot_on_hand (lot_id, quantity) VALUES (NEW.lot_id, NEW.quantity)
	ON CONFLICT (lot_id) DO UPDATE SET quantity = quantity + excluded.quantity;
END;
--> statement-breakpoint
-- Every lot has its row, zero until its first entry, so lists can join on it without losing a lot.
INSERT INTO `lot_on_hand` (`lot_id`, `quantity`)
SELECT `id`, 0 FROM `lot` WHERE `id` NOT IN (SELECT `lot_id` FROM `lot_on_hand`);
--> statement-breakpoint
CREATE TRIGGER lot_on_hand_start AFTER INSERT ON lot
BEGIN
	INSERT OR IGNORE INTO lot_on_hand (lot_id, quantity) VALUES (NEW.id, 0);
END;
