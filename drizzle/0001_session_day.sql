CREATE TABLE `clock_events` (
	`id` text PRIMARY KEY NOT NULL,
	`session_id` text NOT NULL,
	`action` text NOT NULL,
	`at` integer NOT NULL,
	`session_s` real,
	`by_user_id` text,
	FOREIGN KEY (`session_id`) REFERENCES `sessions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `clock_events_session_idx` ON `clock_events` (`session_id`,`at`);--> statement-breakpoint
CREATE TABLE `live_events` (
	`id` text PRIMARY KEY NOT NULL,
	`session_id` text NOT NULL,
	`seq` integer NOT NULL,
	`type` text NOT NULL,
	`summary` text NOT NULL,
	`at` integer NOT NULL,
	FOREIGN KEY (`session_id`) REFERENCES `sessions`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `live_events_session_seq_idx` ON `live_events` (`session_id`,`seq`);--> statement-breakpoint
CREATE TABLE `run_repairs` (
	`id` text PRIMARY KEY NOT NULL,
	`session_id` text NOT NULL,
	`run_id` text NOT NULL,
	`delay_s` real NOT NULL,
	`applied_at` integer NOT NULL,
	`by_user_id` text,
	FOREIGN KEY (`session_id`) REFERENCES `sessions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `run_repairs_session_idx` ON `run_repairs` (`session_id`);--> statement-breakpoint
CREATE TABLE `run_reports` (
	`id` text PRIMARY KEY NOT NULL,
	`session_id` text NOT NULL,
	`run_id` text NOT NULL,
	`kind` text NOT NULL,
	`reason` text,
	`session_s` real NOT NULL,
	`reported_at` integer NOT NULL,
	`correction` integer DEFAULT false NOT NULL,
	`withdrawn` integer DEFAULT false NOT NULL,
	`by_user_id` text,
	FOREIGN KEY (`session_id`) REFERENCES `sessions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `run_reports_session_idx` ON `run_reports` (`session_id`,`reported_at`);--> statement-breakpoint
ALTER TABLE `sessions` ADD `stand_s` real DEFAULT 60 NOT NULL;--> statement-breakpoint
ALTER TABLE `sessions` ADD `punctual_fast_min` real DEFAULT 3 NOT NULL;