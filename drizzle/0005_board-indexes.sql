-- The board's filters and orders served by indexes at 100,000 assets (see DEVELOPERS.md, Scale).
ALTER TABLE `asset_status` ADD `site_name` text DEFAULT '' NOT NULL;--> statement-breakpoint
UPDATE `asset_status` SET `site_name` = coalesce((SELECT `name` FROM `sites` WHERE `sites`.`id` = `asset_status`.`site_id`), '');--> statement-breakpoint
CREATE INDEX `status_kind_verdict_idx` ON `asset_status` (`machine_kind`,`verdict`,`stale_after`);--> statement-breakpoint
CREATE INDEX `status_site_verdict_idx` ON `asset_status` (`site_id`,`verdict`,`stale_after`);--> statement-breakpoint
CREATE INDEX `status_verdict_board_idx` ON `asset_status` (`verdict`,"verdict_rank" desc,`worst_margin_over_range_pct`,`tag`);--> statement-breakpoint
CREATE INDEX `status_verdict_tag_idx` ON `asset_status` (`verdict`,`tag`);--> statement-breakpoint
CREATE INDEX `status_site_name_idx` ON `asset_status` (`site_name`,`tag`);--> statement-breakpoint
CREATE INDEX `status_verdict_site_name_idx` ON `asset_status` (`verdict`,`site_name`,`tag`);--> statement-breakpoint
CREATE INDEX `status_over_range_idx` ON `asset_status` (`worst_margin_over_range_pct`,`tag`);--> statement-breakpoint
CREATE INDEX `status_verdict_over_range_idx` ON `asset_status` (`verdict`,`worst_margin_over_range_pct`,`tag`);--> statement-breakpoint
CREATE INDEX `status_at_speed_idx` ON `asset_status` (`worst_margin_at_speed_pct`,`tag`);--> statement-breakpoint
CREATE INDEX `status_verdict_at_speed_idx` ON `asset_status` (`verdict`,`worst_margin_at_speed_pct`,`tag`);--> statement-breakpoint
CREATE INDEX `status_checked_tag_idx` ON `asset_status` (`checked_at`,`tag`);--> statement-breakpoint
CREATE INDEX `status_verdict_checked_idx` ON `asset_status` (`verdict`,`checked_at`,`tag`);