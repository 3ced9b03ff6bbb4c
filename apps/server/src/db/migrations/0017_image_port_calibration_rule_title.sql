ALTER TABLE `images` ADD `port` text;--> statement-breakpoint
ALTER TABLE `images` ADD `calibration` text;--> statement-breakpoint
ALTER TABLE `images` ADD `calibration_image_id` text;--> statement-breakpoint
ALTER TABLE `limit_rules` ADD `title` text DEFAULT '' NOT NULL;