CREATE TABLE `member_invitations` (
	`id` text PRIMARY KEY NOT NULL,
	`railway_id` text NOT NULL,
	`email` text NOT NULL,
	`role` text NOT NULL,
	`invited_by_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`railway_id`) REFERENCES `railways`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`invited_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `member_invitations_railway_email_idx` ON `member_invitations` (`railway_id`,`email`);--> statement-breakpoint
CREATE INDEX `member_invitations_email_idx` ON `member_invitations` (`email`);