ALTER TABLE `auth_tokens` ADD `pending_password_hash` text;--> statement-breakpoint
ALTER TABLE `auth_tokens` ADD `pending_name` text;