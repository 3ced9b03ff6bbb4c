ALTER TABLE `engine_models` ADD `standard_interval` text;--> statement-breakpoint
ALTER TABLE `engines` ADD `pre_fleet_inspection` text;--> statement-breakpoint
ALTER TABLE `engines` ADD `shop_release` text;