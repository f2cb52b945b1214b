ALTER TABLE `drivers` ADD `drop_ohms` real DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `drivers` ADD `drop_max_volts` real;--> statement-breakpoint
ALTER TABLE `drivers` ADD `drop_max_ohms` real;--> statement-breakpoint
ALTER TABLE `drivers` ADD `peak_pulse_ms` real;--> statement-breakpoint
ALTER TABLE `drivers` ADD `package_watts` real;--> statement-breakpoint
ALTER TABLE `locomotives` ADD `start_volts` real;--> statement-breakpoint
-- Drivers made from a preset whose drop is still the preset's old single figure take the preset's
-- drop lines, pulse width and package rating; hand-edited drops stay a flat line (ohms 0).
UPDATE `drivers` SET `drop_volts` = 1.6, `drop_ohms` = 1.0, `drop_max_volts` = 2.6, `drop_max_ohms` = 1.0, `peak_pulse_ms` = 5, `package_watts` = 2.075
  WHERE `preset_id` = 'bipolar-quad-half-h-1a' AND `drop_volts` = 2.6;--> statement-breakpoint
UPDATE `drivers` SET `drop_volts` = 0.84, `drop_ohms` = 0.96, `drop_max_volts` = 1.5, `drop_max_ohms` = 1.7, `peak_pulse_ms` = 10, `package_watts` = 25
  WHERE `preset_id` = 'bipolar-dual-full-bridge-2a' AND `drop_volts` IN (4.9, 2.76);--> statement-breakpoint
UPDATE `drivers` SET `drop_volts` = 0, `drop_ohms` = 0.5, `peak_pulse_ms` = 10
  WHERE `preset_id` = 'mosfet-dual-low-voltage-1-2a' AND `drop_volts` = 0.6;--> statement-breakpoint
UPDATE `drivers` SET `drop_volts` = 0, `drop_ohms` = 0.565, `package_watts` = 3.1,
  `channel_amps` = CASE WHEN `channel_amps` = 3.6 THEN 1.9 ELSE `channel_amps` END
  WHERE `preset_id` = 'mosfet-single-high-current-3-6a' AND `drop_volts` IN (2.034, 1.074);--> statement-breakpoint
UPDATE `drivers` SET `drop_volts` = 0, `drop_ohms` = 0.36
  WHERE `preset_id` = 'mosfet-dual-very-low-voltage-1-5a' AND `drop_volts` = 0.54;
