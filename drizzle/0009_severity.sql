CREATE TABLE `severity_limits` (
	`machine_group` text NOT NULL,
	`support` text NOT NULL,
	`ab_mm_s` real NOT NULL,
	`bc_mm_s` real NOT NULL,
	`cd_mm_s` real NOT NULL,
	`source` text NOT NULL,
	`updated_at` integer NOT NULL,
	PRIMARY KEY(`machine_group`, `support`)
);
--> statement-breakpoint
ALTER TABLE `asset_status` ADD `overall_velocity_mm_s` real;--> statement-breakpoint
ALTER TABLE `asset_status` ADD `severity_zone` text;--> statement-breakpoint
ALTER TABLE `asset_status` ADD `zone_rank` integer DEFAULT 4 NOT NULL;--> statement-breakpoint
CREATE INDEX `status_zone_idx` ON `asset_status` (`zone_rank`,`verdict_rank`,`worst_margin_over_range_pct`);--> statement-breakpoint
ALTER TABLE `assets` ADD `machine_group` text;--> statement-breakpoint
ALTER TABLE `checks` ADD `overall_velocity_mm_s` real;--> statement-breakpoint
ALTER TABLE `checks` ADD `severity_zone` text;--> statement-breakpoint
ALTER TABLE `checks` ADD `severity` text;--> statement-breakpoint
INSERT INTO `severity_limits` VALUES ('group1', 'rigid', 2.3, 4.5, 7.1, 'ISO 20816-3:2022 Annex A (zone boundaries as quoted by public implementations; confirm against your licensed copy and the machine maker’s limits)', CAST(strftime('%s','now') AS integer) * 1000);
--> statement-breakpoint
INSERT INTO `severity_limits` VALUES ('group1', 'flexible', 3.5, 7.1, 11, 'ISO 20816-3:2022 Annex A (zone boundaries as quoted by public implementations; confirm against your licensed copy and the machine maker’s limits)', CAST(strftime('%s','now') AS integer) * 1000);
--> statement-breakpoint
INSERT INTO `severity_limits` VALUES ('group2', 'rigid', 1.4, 2.8, 4.5, 'ISO 20816-3:2022 Annex A (zone boundaries as quoted by public implementations; confirm against your licensed copy and the machine maker’s limits)', CAST(strftime('%s','now') AS integer) * 1000);
--> statement-breakpoint
INSERT INTO `severity_limits` VALUES ('group2', 'flexible', 2.3, 4.5, 7.1, 'ISO 20816-3:2022 Annex A (zone boundaries as quoted by public implementations; confirm against your licensed copy and the machine maker’s limits)', CAST(strftime('%s','now') AS integer) * 1000);
