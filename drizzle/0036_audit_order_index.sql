DROP INDEX `audit_at_idx`;--> statement-breakpoint
CREATE INDEX `audit_at_seq_idx` ON `audit_event` (`at`,`seq`);