ALTER TABLE `asset_status` ADD `site_id` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `asset_status` ADD `area_id` text;--> statement-breakpoint
ALTER TABLE `asset_status` ADD `machine_kind` text DEFAULT 'other' NOT NULL;--> statement-breakpoint
ALTER TABLE `asset_status` ADD `tag` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `asset_status` ADD `name` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `asset_status` ADD `stale_after` integer;--> statement-breakpoint
CREATE INDEX `status_site_worst_idx` ON `asset_status` (`site_id`,`verdict_rank`,`worst_margin_over_range_pct`);--> statement-breakpoint
CREATE INDEX `status_verdict_idx` ON `asset_status` (`verdict`,`stale_after`);--> statement-breakpoint
CREATE INDEX `status_tag_idx` ON `asset_status` (`tag`);--> statement-breakpoint
UPDATE `asset_status` SET
	`site_id` = (SELECT `site_id` FROM `assets` WHERE `assets`.`id` = `asset_status`.`asset_id`),
	`area_id` = (SELECT `area_id` FROM `assets` WHERE `assets`.`id` = `asset_status`.`asset_id`),
	`machine_kind` = (SELECT `machine_kind` FROM `assets` WHERE `assets`.`id` = `asset_status`.`asset_id`),
	`tag` = (SELECT `tag` FROM `assets` WHERE `assets`.`id` = `asset_status`.`asset_id`),
	`name` = (SELECT `name` FROM `assets` WHERE `assets`.`id` = `asset_status`.`asset_id`),
	`stale_after` = CASE WHEN `checked_at` IS NULL THEN NULL ELSE `checked_at` + 86400000 * (SELECT `sites`.`recheck_days` FROM `assets` JOIN `sites` ON `sites`.`id` = `assets`.`site_id` WHERE `assets`.`id` = `asset_status`.`asset_id`) END;
