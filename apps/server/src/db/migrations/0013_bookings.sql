CREATE TABLE `bookings` (
	`engine_id` text PRIMARY KEY NOT NULL,
	`planned_date` text NOT NULL,
	`note` text DEFAULT '' NOT NULL,
	`due_date_at_booking` text,
	`booked_by` text NOT NULL,
	`booked_at` integer NOT NULL,
	FOREIGN KEY (`engine_id`) REFERENCES `engines`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`booked_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
