CREATE TABLE `images` (
	`id` text PRIMARY KEY NOT NULL,
	`inspection_id` text NOT NULL,
	`sha256` text NOT NULL,
	`format` text NOT NULL,
	`bytes` integer NOT NULL,
	`width` integer NOT NULL,
	`height` integer NOT NULL,
	`original_name` text NOT NULL,
	`captured_at` text,
	`source` text NOT NULL,
	`video_file_name` text,
	`video_time_seconds` real,
	`row_key` text,
	`position` integer,
	`thumbnail` blob NOT NULL,
	`thumbnail_type` text NOT NULL,
	`preview` blob NOT NULL,
	`preview_type` text NOT NULL,
	`created_by` text NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`inspection_id`) REFERENCES `inspections`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `images_inspection_sha_idx` ON `images` (`inspection_id`,`sha256`);--> statement-breakpoint
CREATE INDEX `images_sha_idx` ON `images` (`sha256`);--> statement-breakpoint
CREATE TABLE `inspections` (
	`id` text PRIMARY KEY NOT NULL,
	`engine_id` text NOT NULL,
	`date` text NOT NULL,
	`reason` text NOT NULL,
	`reason_detail` text DEFAULT '' NOT NULL,
	`csn` integer NOT NULL,
	`tsn` real NOT NULL,
	`inspector_name` text NOT NULL,
	`qualification_ref` text NOT NULL,
	`qualification_expires_on` text NOT NULL,
	`probe` text NOT NULL,
	`probe_calibration_due_on` text NOT NULL,
	`rows` text NOT NULL,
	`state` text NOT NULL,
	`flags` text NOT NULL,
	`created_by` text NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`engine_id`) REFERENCES `engines`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `inspections_engine_date_idx` ON `inspections` (`engine_id`,`date`);