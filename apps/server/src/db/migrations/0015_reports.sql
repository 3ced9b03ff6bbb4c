CREATE TABLE `reports` (
	`id` text PRIMARY KEY NOT NULL,
	`inspection_id` text NOT NULL,
	`revision` integer NOT NULL,
	`pdf` blob NOT NULL,
	`pdf_sha256` text NOT NULL,
	`verification_code` text NOT NULL,
	`release_signature_id` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`inspection_id`) REFERENCES `inspections`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`release_signature_id`) REFERENCES `signatures`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `reports_inspection_revision_idx` ON `reports` (`inspection_id`,`revision`);--> statement-breakpoint
CREATE UNIQUE INDEX `reports_code_idx` ON `reports` (`verification_code`);