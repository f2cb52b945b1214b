CREATE TABLE `audit_log` (
	`id` text PRIMARY KEY NOT NULL,
	`railway_id` text,
	`user_id` text,
	`action` text NOT NULL,
	`entity` text NOT NULL,
	`entity_id` text,
	`detail` text,
	`at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`railway_id`) REFERENCES `railways`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `audit_railway_idx` ON `audit_log` (`railway_id`,`at`);--> statement-breakpoint
CREATE TABLE `auth_tokens` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`purpose` text NOT NULL,
	`token_hash` text NOT NULL,
	`expires_at` integer NOT NULL,
	`used_at` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `auth_tokens_token_hash_unique` ON `auth_tokens` (`token_hash`);--> statement-breakpoint
CREATE INDEX `auth_tokens_user_idx` ON `auth_tokens` (`user_id`);--> statement-breakpoint
CREATE TABLE `blocks` (
	`id` text PRIMARY KEY NOT NULL,
	`layout_id` text NOT NULL,
	`name` text NOT NULL,
	`length_mm` real NOT NULL,
	`position_mm` real DEFAULT 0 NOT NULL,
	`version` integer DEFAULT 1 NOT NULL,
	FOREIGN KEY (`layout_id`) REFERENCES `layouts`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `blocks_layout_idx` ON `blocks` (`layout_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `blocks_layout_name_idx` ON `blocks` (`layout_id`,`name`);--> statement-breakpoint
CREATE TABLE `cabs` (
	`id` text PRIMARY KEY NOT NULL,
	`layout_id` text NOT NULL,
	`driver_id` text NOT NULL,
	`name` text NOT NULL,
	`channel` integer NOT NULL,
	`version` integer DEFAULT 1 NOT NULL,
	FOREIGN KEY (`layout_id`) REFERENCES `layouts`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`driver_id`) REFERENCES `drivers`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE INDEX `cabs_layout_idx` ON `cabs` (`layout_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `cabs_driver_channel_idx` ON `cabs` (`driver_id`,`channel`);--> statement-breakpoint
CREATE TABLE `caught_mail` (
	`id` text PRIMARY KEY NOT NULL,
	`message_id` text,
	`from_address` text NOT NULL,
	`to_addresses` text NOT NULL,
	`subject` text NOT NULL,
	`text` text DEFAULT '' NOT NULL,
	`html` text,
	`raw` text NOT NULL,
	`received_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `caught_mail_message_id_unique` ON `caught_mail` (`message_id`);--> statement-breakpoint
CREATE INDEX `caught_mail_received_idx` ON `caught_mail` (`received_at`);--> statement-breakpoint
CREATE TABLE `crew_assignments` (
	`id` text PRIMARY KEY NOT NULL,
	`session_id` text NOT NULL,
	`user_id` text NOT NULL,
	`duty` text DEFAULT 'driver' NOT NULL,
	`note` text DEFAULT '' NOT NULL,
	FOREIGN KEY (`session_id`) REFERENCES `sessions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `crew_session_user_duty_idx` ON `crew_assignments` (`session_id`,`user_id`,`duty`);--> statement-breakpoint
CREATE TABLE `drivers` (
	`id` text PRIMARY KEY NOT NULL,
	`layout_id` text NOT NULL,
	`supply_id` text NOT NULL,
	`name` text NOT NULL,
	`preset_id` text,
	`part_number` text,
	`channels` integer NOT NULL,
	`channel_amps` real NOT NULL,
	`channel_peak_amps` real NOT NULL,
	`total_amps` real,
	`drop_volts` real NOT NULL,
	`version` integer DEFAULT 1 NOT NULL,
	FOREIGN KEY (`layout_id`) REFERENCES `layouts`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`supply_id`) REFERENCES `supplies`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE INDEX `drivers_layout_idx` ON `drivers` (`layout_id`);--> statement-breakpoint
CREATE TABLE `invitations` (
	`id` text PRIMARY KEY NOT NULL,
	`session_id` text NOT NULL,
	`user_id` text NOT NULL,
	`email` text NOT NULL,
	`rsvp` text DEFAULT 'needs-action' NOT NULL,
	`responded_at` integer,
	`reply_nonce` integer DEFAULT 0 NOT NULL,
	`sent_sequence` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`session_id`) REFERENCES `sessions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `invitations_session_user_idx` ON `invitations` (`session_id`,`user_id`);--> statement-breakpoint
CREATE TABLE `layouts` (
	`id` text PRIMARY KEY NOT NULL,
	`railway_id` text NOT NULL,
	`name` text NOT NULL,
	`scale_name` text NOT NULL,
	`scale_ratio` real NOT NULL,
	`setting` text DEFAULT 'indoor' NOT NULL,
	`notes` text DEFAULT '' NOT NULL,
	`track_plan_file` text,
	`track_plan_type` text,
	`version` integer DEFAULT 1 NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`railway_id`) REFERENCES `railways`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `layouts_railway_idx` ON `layouts` (`railway_id`);--> statement-breakpoint
CREATE TABLE `links` (
	`id` text PRIMARY KEY NOT NULL,
	`layout_id` text NOT NULL,
	`block_a_id` text NOT NULL,
	`block_b_id` text NOT NULL,
	FOREIGN KEY (`layout_id`) REFERENCES `layouts`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`block_a_id`) REFERENCES `blocks`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`block_b_id`) REFERENCES `blocks`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `links_layout_idx` ON `links` (`layout_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `links_pair_idx` ON `links` (`block_a_id`,`block_b_id`);--> statement-breakpoint
CREATE TABLE `locomotives` (
	`id` text PRIMARY KEY NOT NULL,
	`layout_id` text NOT NULL,
	`name` text NOT NULL,
	`running_amps` real NOT NULL,
	`stall_amps` real NOT NULL,
	`rated_volts` real NOT NULL,
	`top_speed_kmh` real NOT NULL,
	`version` integer DEFAULT 1 NOT NULL,
	FOREIGN KEY (`layout_id`) REFERENCES `layouts`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `locomotives_layout_idx` ON `locomotives` (`layout_id`);--> statement-breakpoint
CREATE TABLE `memberships` (
	`id` text PRIMARY KEY NOT NULL,
	`railway_id` text NOT NULL,
	`user_id` text NOT NULL,
	`role` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`railway_id`) REFERENCES `railways`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `memberships_railway_user_idx` ON `memberships` (`railway_id`,`user_id`);--> statement-breakpoint
CREATE INDEX `memberships_user_idx` ON `memberships` (`user_id`);--> statement-breakpoint
CREATE TABLE `outbox` (
	`id` text PRIMARY KEY NOT NULL,
	`railway_id` text,
	`invitation_id` text,
	`dedupe_key` text NOT NULL,
	`kind` text NOT NULL,
	`to_address` text NOT NULL,
	`subject` text NOT NULL,
	`text` text NOT NULL,
	`html` text,
	`calendar_method` text,
	`calendar` text,
	`status` text DEFAULT 'queued' NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`next_attempt_at` integer NOT NULL,
	`last_error` text,
	`sent_at` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`railway_id`) REFERENCES `railways`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`invitation_id`) REFERENCES `invitations`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `outbox_dedupe_key_unique` ON `outbox` (`dedupe_key`);--> statement-breakpoint
CREATE INDEX `outbox_status_next_idx` ON `outbox` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE TABLE `railways` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`time_zone` text DEFAULT 'UTC' NOT NULL,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE `run_steps` (
	`id` text PRIMARY KEY NOT NULL,
	`run_id` text NOT NULL,
	`position` integer NOT NULL,
	`block_id` text NOT NULL,
	`enter_s` real NOT NULL,
	`exit_s` real NOT NULL,
	FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`block_id`) REFERENCES `blocks`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE UNIQUE INDEX `run_steps_run_position_idx` ON `run_steps` (`run_id`,`position`);--> statement-breakpoint
CREATE TABLE `runs` (
	`id` text PRIMARY KEY NOT NULL,
	`session_id` text NOT NULL,
	`train_id` text NOT NULL,
	`cab_id` text NOT NULL,
	`operator_id` text,
	`depart_s` real NOT NULL,
	`arrive_s` real NOT NULL,
	`speed_kmh` real,
	`note` text DEFAULT '' NOT NULL,
	`version` integer DEFAULT 1 NOT NULL,
	FOREIGN KEY (`session_id`) REFERENCES `sessions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`train_id`) REFERENCES `trains`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`cab_id`) REFERENCES `cabs`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`operator_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `runs_session_idx` ON `runs` (`session_id`);--> statement-breakpoint
CREATE INDEX `runs_operator_idx` ON `runs` (`operator_id`);--> statement-breakpoint
CREATE TABLE `sessions` (
	`id` text PRIMARY KEY NOT NULL,
	`railway_id` text NOT NULL,
	`layout_id` text NOT NULL,
	`title` text NOT NULL,
	`place` text DEFAULT '' NOT NULL,
	`description` text DEFAULT '' NOT NULL,
	`starts_at` integer NOT NULL,
	`ends_at` integer NOT NULL,
	`time_zone` text NOT NULL,
	`clock_ratio` real NOT NULL,
	`fast_start` text NOT NULL,
	`headway_s` real NOT NULL,
	`surge_s` real NOT NULL,
	`derate` real NOT NULL,
	`status` text DEFAULT 'draft' NOT NULL,
	`sequence` integer DEFAULT 0 NOT NULL,
	`version` integer DEFAULT 1 NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`railway_id`) REFERENCES `railways`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`layout_id`) REFERENCES `layouts`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE INDEX `sessions_railway_idx` ON `sessions` (`railway_id`);--> statement-breakpoint
CREATE INDEX `sessions_starts_idx` ON `sessions` (`starts_at`);--> statement-breakpoint
CREATE TABLE `supplies` (
	`id` text PRIMARY KEY NOT NULL,
	`layout_id` text NOT NULL,
	`name` text NOT NULL,
	`volts` real NOT NULL,
	`amps` real NOT NULL,
	`version` integer DEFAULT 1 NOT NULL,
	FOREIGN KEY (`layout_id`) REFERENCES `layouts`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `supplies_layout_idx` ON `supplies` (`layout_id`);--> statement-breakpoint
CREATE TABLE `train_locomotives` (
	`train_id` text NOT NULL,
	`locomotive_id` text NOT NULL,
	`position` integer NOT NULL,
	FOREIGN KEY (`train_id`) REFERENCES `trains`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`locomotive_id`) REFERENCES `locomotives`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE UNIQUE INDEX `train_locomotives_pk` ON `train_locomotives` (`train_id`,`position`);--> statement-breakpoint
CREATE TABLE `trains` (
	`id` text PRIMARY KEY NOT NULL,
	`layout_id` text NOT NULL,
	`name` text NOT NULL,
	`lighting_amps` real DEFAULT 0 NOT NULL,
	`length_mm` real NOT NULL,
	`version` integer DEFAULT 1 NOT NULL,
	FOREIGN KEY (`layout_id`) REFERENCES `layouts`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `trains_layout_idx` ON `trains` (`layout_id`);--> statement-breakpoint
CREATE TABLE `users` (
	`id` text PRIMARY KEY NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`password_hash` text,
	`email_verified_at` integer,
	`calendar_token` text NOT NULL,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_unique` ON `users` (`email`);--> statement-breakpoint
CREATE UNIQUE INDEX `users_calendar_token_unique` ON `users` (`calendar_token`);