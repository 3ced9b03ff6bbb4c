CREATE TABLE `engine_model_rows` (
	`model_id` text NOT NULL,
	`key` text NOT NULL,
	`sequence` integer NOT NULL,
	`label` text NOT NULL,
	`kind` text NOT NULL,
	`count` integer NOT NULL,
	`numbering` text NOT NULL,
	`zones` text NOT NULL,
	`ports` text NOT NULL,
	PRIMARY KEY(`model_id`, `key`),
	FOREIGN KEY (`model_id`) REFERENCES `engine_models`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `engine_models` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`version` integer NOT NULL,
	`notes` text DEFAULT '' NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `engine_models_name_version_idx` ON `engine_models` (`name`,`version`);--> statement-breakpoint
CREATE TABLE `engines` (
	`id` text PRIMARY KEY NOT NULL,
	`serial_number` text NOT NULL,
	`model_id` text NOT NULL,
	`organisation_id` text NOT NULL,
	`installed_position` text,
	`registration` text,
	`tsn` real NOT NULL,
	`csn` integer NOT NULL,
	`tsn_csn_as_of` text NOT NULL,
	`status` text NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`model_id`) REFERENCES `engine_models`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `engines_model_serial_idx` ON `engines` (`model_id`,`serial_number`);--> statement-breakpoint
CREATE INDEX `engines_organisation_idx` ON `engines` (`organisation_id`,`serial_number`);--> statement-breakpoint
CREATE INDEX `engines_status_idx` ON `engines` (`status`,`serial_number`);--> statement-breakpoint
CREATE INDEX `engines_serial_idx` ON `engines` (`serial_number`);--> statement-breakpoint
CREATE TABLE `report_contacts` (
	`id` text PRIMARY KEY NOT NULL,
	`organisation_id` text NOT NULL,
	`name` text NOT NULL,
	`email` text NOT NULL,
	`role` text NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `report_contacts_org_email_idx` ON `report_contacts` (`organisation_id`,`email`);--> statement-breakpoint
CREATE TABLE `utilization_records` (
	`id` text PRIMARY KEY NOT NULL,
	`engine_id` text NOT NULL,
	`period_start` text NOT NULL,
	`period_end` text NOT NULL,
	`cycles` integer NOT NULL,
	`hours` real NOT NULL,
	`source` text NOT NULL,
	`created_by` text,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`engine_id`) REFERENCES `engines`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `utilization_engine_period_idx` ON `utilization_records` (`engine_id`,`period_end`);