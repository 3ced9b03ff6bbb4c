ALTER TABLE `users` ADD `authorisation` text;--> statement-breakpoint
ALTER TABLE `users` ADD `qualification` text;