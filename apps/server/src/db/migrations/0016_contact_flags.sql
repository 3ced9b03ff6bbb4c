ALTER TABLE `report_contacts` ADD `receives_reports` integer DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE `report_contacts` ADD `receives_urgent` integer DEFAULT true NOT NULL;