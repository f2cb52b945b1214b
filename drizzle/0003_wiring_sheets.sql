CREATE TABLE `wiring_sheets` (
	`layout_id` text PRIMARY KEY NOT NULL,
	`sheet` text NOT NULL,
	`version` integer DEFAULT 1 NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`layout_id`) REFERENCES `layouts`(`id`) ON UPDATE no action ON DELETE cascade
);
