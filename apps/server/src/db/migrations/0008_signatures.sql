CREATE TABLE `signatures` (
	`seq` integer PRIMARY KEY NOT NULL,
	`id` text NOT NULL,
	`kind` text NOT NULL,
	`subject_id` text NOT NULL,
	`signer` text NOT NULL,
	`signed_at` text NOT NULL,
	`meaning` text NOT NULL,
	`content` text NOT NULL,
	`content_sha256` text NOT NULL,
	`prev_sha256` text NOT NULL,
	`sha256` text NOT NULL,
	`mac` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `signatures_id_unique` ON `signatures` (`id`);--> statement-breakpoint
CREATE UNIQUE INDEX `signatures_sha256_unique` ON `signatures` (`sha256`);--> statement-breakpoint
CREATE INDEX `signatures_subject_idx` ON `signatures` (`kind`,`subject_id`);