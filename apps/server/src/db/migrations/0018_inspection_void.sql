ALTER TABLE `inspections` ADD `void_reason` text;--> statement-breakpoint
ALTER TABLE `inspections` ADD `voided_by` text REFERENCES users(id);--> statement-breakpoint
ALTER TABLE `inspections` ADD `voided_at` integer;