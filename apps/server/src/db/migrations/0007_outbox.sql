CREATE TABLE `outbox_attachments` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`message_id` text NOT NULL,
	`filename` text NOT NULL,
	`content_type` text NOT NULL,
	`size` integer NOT NULL,
	`content` blob NOT NULL,
	FOREIGN KEY (`message_id`) REFERENCES `outbox_messages`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `outbox_attachments_message_idx` ON `outbox_attachments` (`message_id`);--> statement-breakpoint
CREATE TABLE `outbox_messages` (
	`id` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`recipients` text NOT NULL,
	`subject` text NOT NULL,
	`text` text NOT NULL,
	`html` text,
	`record_type` text,
	`record_id` text,
	`record_label` text,
	`state` text NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`last_error` text,
	`next_attempt_at` integer,
	`lease_until` integer,
	`sent_at` integer,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL
);
--> statement-breakpoint
CREATE INDEX `outbox_messages_due_idx` ON `outbox_messages` (`state`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `outbox_messages_record_idx` ON `outbox_messages` (`record_type`,`record_id`);--> statement-breakpoint
CREATE INDEX `outbox_messages_created_idx` ON `outbox_messages` (`created_at`);