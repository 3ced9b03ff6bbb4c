ALTER TABLE `audit_log` ADD `seq` integer;--> statement-breakpoint
ALTER TABLE `audit_log` ADD `prev_hash` text;--> statement-breakpoint
ALTER TABLE `audit_log` ADD `hash` text;--> statement-breakpoint
ALTER TABLE `audit_log` ADD `mac` text;--> statement-breakpoint
CREATE UNIQUE INDEX `audit_log_seq_idx` ON `audit_log` (`seq`);