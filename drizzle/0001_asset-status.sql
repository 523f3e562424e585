CREATE TABLE `asset_status` (
	`asset_id` text PRIMARY KEY NOT NULL,
	`latest_check_id` text,
	`checked_at` integer,
	`checked_by` text,
	`measured_rpm` real,
	`verdict` text DEFAULT 'unchecked' NOT NULL,
	`verdict_rank` integer DEFAULT 0 NOT NULL,
	`worst_margin_at_speed_pct` real,
	`worst_margin_over_range_pct` real,
	`worst_pair` text,
	`open_follow_ups` integer DEFAULT 0 NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`asset_id`) REFERENCES `assets`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`latest_check_id`) REFERENCES `checks`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `status_worst_idx` ON `asset_status` (`verdict_rank`,`worst_margin_over_range_pct`);--> statement-breakpoint
CREATE INDEX `status_checked_idx` ON `asset_status` (`checked_at`);