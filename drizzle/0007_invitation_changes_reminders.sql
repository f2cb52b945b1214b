ALTER TABLE `invitations` ADD `sent_snapshot` text;--> statement-breakpoint
ALTER TABLE `invitations` ADD `reminded_at` integer;--> statement-breakpoint
ALTER TABLE `invitations` ADD `reminder_count` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `invitations` ADD `comment` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `sessions` ADD `reply_by` integer;