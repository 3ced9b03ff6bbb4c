CREATE TABLE `dispositions` (
	`id` text PRIMARY KEY NOT NULL,
	`finding_id` text NOT NULL,
	`inspection_id` text NOT NULL,
	`decision` text NOT NULL,
	`kind` text NOT NULL,
	`rationale` text NOT NULL,
	`concession` integer NOT NULL,
	`concession_ref` text,
	`supersedes_id` text,
	`supersede_reason` text,
	`recurrence` text,
	`state` text NOT NULL,
	`signature_id` text NOT NULL,
	`signed_by` text NOT NULL,
	`signed_at` integer NOT NULL,
	FOREIGN KEY (`finding_id`) REFERENCES `findings`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`inspection_id`) REFERENCES `inspections`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`signed_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `dispositions_finding_idx` ON `dispositions` (`finding_id`);--> statement-breakpoint
CREATE INDEX `dispositions_inspection_idx` ON `dispositions` (`inspection_id`,`state`);--> statement-breakpoint
ALTER TABLE `inspections` ADD `returned_by` text REFERENCES users(id);--> statement-breakpoint
ALTER TABLE `inspections` ADD `returned_at` integer;--> statement-breakpoint
ALTER TABLE `inspections` ADD `submitted_at` integer;--> statement-breakpoint
ALTER TABLE `inspections` ADD `limit_set_id` text REFERENCES limit_sets(id);--> statement-breakpoint
ALTER TABLE `inspections` ADD `outcome_signature_id` text;--> statement-breakpoint
ALTER TABLE `inspections` ADD `release_signature_id` text;--> statement-breakpoint
ALTER TABLE `inspections` ADD `release_revision` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
UPDATE `inspections` SET `submitted_at` = `created_at` WHERE `state` <> 'draft';--> statement-breakpoint
UPDATE `inspections` SET `limit_set_id` = (SELECT `limit_set_id` FROM `findings` WHERE `findings`.`inspection_id` = `inspections`.`id` AND `limit_set_id` IS NOT NULL LIMIT 1) WHERE `state` <> 'draft';--> statement-breakpoint
UPDATE `inspections` SET `release_revision` = 1 WHERE `state` = 'released';
