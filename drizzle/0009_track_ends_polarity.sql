DROP INDEX `links_pair_idx`;--> statement-breakpoint
ALTER TABLE `links` ADD `block_a_end` text DEFAULT 'b' NOT NULL;--> statement-breakpoint
ALTER TABLE `links` ADD `block_b_end` text DEFAULT 'a' NOT NULL;--> statement-breakpoint
-- Ends along the line's position order: the line runs from the block nearer its start (smaller
-- position_mm) to the one further along, whose `a` end meets the other's `b` end. Equal positions keep
-- the default (block A's b end to block B's a end). Every link is kept.
UPDATE `links` SET `block_a_end` = 'a', `block_b_end` = 'b'
  WHERE (SELECT `position_mm` FROM `blocks` WHERE `blocks`.`id` = `links`.`block_a_id`)
      > (SELECT `position_mm` FROM `blocks` WHERE `blocks`.`id` = `links`.`block_b_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `links_joint_idx` ON `links` (`block_a_id`,`block_a_end`,`block_b_id`,`block_b_end`);--> statement-breakpoint
ALTER TABLE `blocks` ADD `positive_rail` text DEFAULT 'right' NOT NULL;--> statement-breakpoint
ALTER TABLE `blocks` ADD `reversing_section` integer DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `blocks` ADD `reversing_place` integer DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `run_steps` ADD `from_end` text;--> statement-breakpoint
ALTER TABLE `run_steps` ADD `to_end` text;