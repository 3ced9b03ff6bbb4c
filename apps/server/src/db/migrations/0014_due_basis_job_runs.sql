CREATE TABLE `engine_due` (
	`engine_id` text PRIMARY KEY NOT NULL,
	`basis` text NOT NULL,
	`last_move` text,
	`computed_at` integer NOT NULL,
	FOREIGN KEY (`engine_id`) REFERENCES `engines`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `job_runs` (
	`job` text PRIMARY KEY NOT NULL,
	`last_day` text NOT NULL,
	`ran_at` integer NOT NULL
);
--> statement-breakpoint
CREATE INDEX `inspections_submitted_idx` ON `inspections` (`engine_id`,`date`) WHERE "inspections"."state" = 'submitted';