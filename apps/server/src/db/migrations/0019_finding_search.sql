CREATE TABLE `finding_search` (
	`finding_id` text PRIMARY KEY NOT NULL,
	`inspection_id` text NOT NULL,
	`inspection_date` text NOT NULL,
	`released` integer NOT NULL,
	`engine_id` text NOT NULL,
	`engine_serial` text NOT NULL,
	`organisation_id` text NOT NULL,
	`model_id` text NOT NULL,
	`number` integer NOT NULL,
	`row_key` text NOT NULL,
	`position` integer NOT NULL,
	`zone` text NOT NULL,
	`damage` text NOT NULL,
	`length_mm` real,
	`area_mm2` real,
	`depth_mm` real,
	`severity` integer,
	`decision` text,
	`released_decision` text
);
--> statement-breakpoint
CREATE INDEX `finding_search_inspection_idx` ON `finding_search` (`inspection_id`);--> statement-breakpoint
CREATE INDEX `finding_search_date_idx` ON `finding_search` (inspection_date DESC,`engine_serial`,`number`);--> statement-breakpoint
CREATE INDEX `finding_search_engine_idx` ON `finding_search` (`engine_id`,inspection_date DESC,`engine_serial`,`number`);--> statement-breakpoint
CREATE INDEX `finding_search_owner_idx` ON `finding_search` (`organisation_id`,`released`,inspection_date DESC,`engine_serial`,`number`);--> statement-breakpoint
CREATE INDEX `finding_search_model_idx` ON `finding_search` (`model_id`,inspection_date DESC,`engine_serial`,`number`);--> statement-breakpoint
CREATE INDEX `finding_search_severity_idx` ON `finding_search` (`severity`,inspection_date DESC,`engine_serial`,`number`);--> statement-breakpoint
CREATE INDEX `finding_search_decision_idx` ON `finding_search` (`decision`,inspection_date DESC,`engine_serial`,`number`);--> statement-breakpoint
CREATE INDEX `finding_search_damage_idx` ON `finding_search` (`row_key`,`damage`,`length_mm`);--> statement-breakpoint
CREATE INDEX `finding_search_serial_idx` ON `finding_search` (`engine_serial`,inspection_date DESC,`number`);--> statement-breakpoint
CREATE INDEX `finding_search_length_idx` ON `finding_search` (`length_mm`);--> statement-breakpoint
CREATE INDEX `finding_search_area_idx` ON `finding_search` (`area_mm2`);--> statement-breakpoint
CREATE INDEX `finding_search_depth_idx` ON `finding_search` (`depth_mm`);--> statement-breakpoint
CREATE TABLE `finding_search_counts` (
	`released` integer NOT NULL,
	`organisation_id` text NOT NULL,
	`model_id` text NOT NULL,
	`row_key` text NOT NULL,
	`zone` text NOT NULL,
	`damage` text NOT NULL,
	`severity` integer,
	`decision` text,
	`released_decision` text,
	`has_length` integer NOT NULL,
	`has_area` integer NOT NULL,
	`has_depth` integer NOT NULL,
	`n` integer NOT NULL
);
--> statement-breakpoint
CREATE INDEX `finding_search_counts_key_idx` ON `finding_search_counts` (`organisation_id`,`model_id`,`row_key`,`damage`,`zone`,`severity`,`decision`,`released_decision`,`released`,`has_length`,`has_area`,`has_depth`);