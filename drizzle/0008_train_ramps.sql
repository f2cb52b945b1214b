ALTER TABLE `trains` ADD `accel_kmh_per_s` real;--> statement-breakpoint
ALTER TABLE `trains` ADD `braking_kmh_per_s` real;