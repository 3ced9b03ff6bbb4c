CREATE TABLE `findings` (
	`id` text PRIMARY KEY NOT NULL,
	`inspection_id` text NOT NULL,
	`number` integer NOT NULL,
	`image_id` text NOT NULL,
	`shape` text NOT NULL,
	`calibration` text,
	`pick_uncertainty_px` real NOT NULL,
	`row_key` text NOT NULL,
	`position` integer NOT NULL,
	`zone` text NOT NULL,
	`damage` text NOT NULL,
	`method` text NOT NULL,
	`mm_per_px` real,
	`length_mm` real,
	`area_mm2` real,
	`perimeter_mm` real,
	`max_extent_mm` real,
	`uncertainty_mm` real,
	`uncertainty_mm2` real,
	`width_mm` real,
	`depth_mm` real,
	`count` integer,
	`notes` text DEFAULT '' NOT NULL,
	`previous_finding_id` text,
	`series_id` text NOT NULL,
	`status` text NOT NULL,
	`void_reason` text,
	`voided_at` integer,
	`voided_by` text,
	`evaluation` text,
	`category` text,
	`limit_set_id` text,
	`evaluated_at` integer,
	`created_by` text NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`inspection_id`) REFERENCES `inspections`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`image_id`) REFERENCES `images`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`voided_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`limit_set_id`) REFERENCES `limit_sets`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `findings_inspection_number_idx` ON `findings` (`inspection_id`,`number`);--> statement-breakpoint
CREATE INDEX `findings_inspection_row_idx` ON `findings` (`inspection_id`,`row_key`,`position`);--> statement-breakpoint
CREATE INDEX `findings_series_idx` ON `findings` (`series_id`);--> statement-breakpoint
CREATE INDEX `findings_previous_idx` ON `findings` (`previous_finding_id`);--> statement-breakpoint
CREATE INDEX `findings_category_idx` ON `findings` (`category`);--> statement-breakpoint
CREATE INDEX `findings_row_idx` ON `findings` (`row_key`);--> statement-breakpoint
CREATE TABLE `limit_rules` (
	`limit_set_id` text NOT NULL,
	`rule_id` text NOT NULL,
	`sequence` integer NOT NULL,
	`row_key` text NOT NULL,
	`zones` text NOT NULL,
	`damage` text NOT NULL,
	`measure` text NOT NULL,
	`unit` text NOT NULL,
	`serviceable_max` real,
	`repeat_max` real,
	`repeat_interval` text,
	`beyond_action` text,
	`not_permitted` integer NOT NULL,
	`max_per_airfoil` integer,
	`max_total_per_airfoil` real,
	`max_airfoils_per_row` integer,
	`max_adjacent_airfoils` integer,
	`reference` text NOT NULL,
	PRIMARY KEY(`limit_set_id`, `rule_id`),
	FOREIGN KEY (`limit_set_id`) REFERENCES `limit_sets`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `limit_sets` (
	`id` text PRIMARY KEY NOT NULL,
	`model_id` text NOT NULL,
	`revision` text NOT NULL,
	`title` text NOT NULL,
	`status` text NOT NULL,
	`manual_reference` text NOT NULL,
	`effective_date` text,
	`invented` integer DEFAULT false NOT NULL,
	`based_on_id` text,
	`published_at` integer,
	`published_by` text,
	`content_sha256` text,
	`created_by` text,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`model_id`) REFERENCES `engine_models`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`published_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `limit_sets_model_revision_idx` ON `limit_sets` (`model_id`,`revision`);--> statement-breakpoint
CREATE UNIQUE INDEX `limit_sets_model_published_idx` ON `limit_sets` (`model_id`) WHERE status = 'published';--> statement-breakpoint
CREATE TABLE `row_coverage` (
	`inspection_id` text NOT NULL,
	`row_key` text NOT NULL,
	`status` text NOT NULL,
	`viewed_positions` text NOT NULL,
	`no_damage_found` integer NOT NULL,
	`reason` text NOT NULL,
	`updated_by` text NOT NULL,
	`updated_at` integer NOT NULL,
	PRIMARY KEY(`inspection_id`, `row_key`),
	FOREIGN KEY (`inspection_id`) REFERENCES `inspections`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
