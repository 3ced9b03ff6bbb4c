ALTER TABLE `findings` ADD `repeat_cycles` real;--> statement-breakpoint
ALTER TABLE `findings` ADD `repeat_hours` real;--> statement-breakpoint
ALTER TABLE `findings` ADD `repeat_days` real;--> statement-breakpoint
UPDATE `findings` SET `repeat_cycles` = json_extract(`evaluation`, '$.repeatInterval.cycles'), `repeat_hours` = json_extract(`evaluation`, '$.repeatInterval.hours'), `repeat_days` = json_extract(`evaluation`, '$.repeatInterval.days') WHERE `evaluation` IS NOT NULL;--> statement-breakpoint
CREATE INDEX `findings_impact_idx` ON `findings` (`inspection_id`,`status`,`number`,`row_key`,`position`,`zone`,`damage`,`length_mm`,`width_mm`,`depth_mm`,`area_mm2`,`count`,`uncertainty_mm`,`uncertainty_mm2`,`category`,`repeat_cycles`,`repeat_hours`,`repeat_days`,`limit_set_id`);