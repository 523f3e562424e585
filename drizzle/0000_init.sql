CREATE TABLE `areas` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`name` text NOT NULL,
	`version` integer DEFAULT 0 NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `areas_site_idx` ON `areas` (`site_id`);--> statement-breakpoint
CREATE TABLE `assets` (
	`id` text PRIMARY KEY NOT NULL,
	`tag` text NOT NULL,
	`name` text NOT NULL,
	`site_id` text NOT NULL,
	`area_id` text,
	`machine_kind` text NOT NULL,
	`drive_type` text NOT NULL,
	`min_rpm` real NOT NULL,
	`max_rpm` real NOT NULL,
	`nominal_rpm` real,
	`motor_poles` integer,
	`drive_ratio` real DEFAULT 1 NOT NULL,
	`skip_bands` integer DEFAULT 3 NOT NULL,
	`rule_set_id` text,
	`notes` text DEFAULT '' NOT NULL,
	`version` integer DEFAULT 0 NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`area_id`) REFERENCES `areas`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`rule_set_id`) REFERENCES `rule_sets`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `assets_tag_idx` ON `assets` (`tag`);--> statement-breakpoint
CREATE INDEX `assets_site_idx` ON `assets` (`site_id`,`area_id`);--> statement-breakpoint
CREATE INDEX `assets_version_idx` ON `assets` (`version`);--> statement-breakpoint
CREATE TABLE `audit_log` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`at` integer NOT NULL,
	`user_id` text,
	`entity` text NOT NULL,
	`entity_id` text NOT NULL,
	`action` text NOT NULL,
	`before` text,
	`after` text,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `audit_entity_idx` ON `audit_log` (`entity`,`entity_id`,`at`);--> statement-breakpoint
CREATE INDEX `audit_at_idx` ON `audit_log` (`at`);--> statement-breakpoint
CREATE TABLE `checks` (
	`id` text PRIMARY KEY NOT NULL,
	`asset_id` text NOT NULL,
	`user_id` text NOT NULL,
	`checked_at` integer NOT NULL,
	`received_at` integer NOT NULL,
	`measured_rpm` real,
	`drive_setpoint_hz` real,
	`notes` text DEFAULT '' NOT NULL,
	`replaces_check_id` text,
	`rule_set_id` text,
	`rule_snapshot` text,
	`verdict` text NOT NULL,
	`verdict_at_speed` text NOT NULL,
	`worst_margin_at_speed_pct` real,
	`worst_margin_over_range_pct` real,
	`worst_pair` text,
	`result` text,
	`device_result` text,
	`result_differs` integer DEFAULT false NOT NULL,
	`reviewed_by` text,
	`reviewed_at` integer,
	`review_comment` text,
	FOREIGN KEY (`asset_id`) REFERENCES `assets`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`rule_set_id`) REFERENCES `rule_sets`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`reviewed_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `checks_asset_idx` ON `checks` (`asset_id`,`checked_at`);--> statement-breakpoint
CREATE INDEX `checks_user_idx` ON `checks` (`user_id`);--> statement-breakpoint
CREATE TABLE `deletions` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`entity` text NOT NULL,
	`row_id` text NOT NULL,
	`site_id` text,
	`version` integer NOT NULL,
	`deleted_at` integer NOT NULL
);
--> statement-breakpoint
CREATE INDEX `deletions_version_idx` ON `deletions` (`version`);--> statement-breakpoint
CREATE TABLE `excitation_sources` (
	`id` text PRIMARY KEY NOT NULL,
	`asset_id` text NOT NULL,
	`kind` text NOT NULL,
	`label` text DEFAULT '' NOT NULL,
	`params` text NOT NULL,
	`sort_order` integer DEFAULT 0 NOT NULL,
	`version` integer DEFAULT 0 NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`asset_id`) REFERENCES `assets`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `sources_asset_idx` ON `excitation_sources` (`asset_id`);--> statement-breakpoint
CREATE INDEX `sources_version_idx` ON `excitation_sources` (`version`);--> statement-breakpoint
CREATE TABLE `follow_ups` (
	`id` text PRIMARY KEY NOT NULL,
	`asset_id` text NOT NULL,
	`check_id` text,
	`created_by` text NOT NULL,
	`assignee_id` text,
	`title` text NOT NULL,
	`remedy` text,
	`status` text DEFAULT 'open' NOT NULL,
	`priority` text DEFAULT 'normal' NOT NULL,
	`due_date` text,
	`notes` text DEFAULT '' NOT NULL,
	`retest_check_id` text,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`asset_id`) REFERENCES `assets`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`check_id`) REFERENCES `checks`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`assignee_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`retest_check_id`) REFERENCES `checks`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `follow_ups_asset_idx` ON `follow_ups` (`asset_id`,`status`);--> statement-breakpoint
CREATE INDEX `follow_ups_assignee_idx` ON `follow_ups` (`assignee_id`,`status`);--> statement-breakpoint
CREATE TABLE `mail` (
	`id` text PRIMARY KEY NOT NULL,
	`dedupe_key` text,
	`kind` text NOT NULL,
	`to_address` text NOT NULL,
	`subject` text NOT NULL,
	`text_body` text NOT NULL,
	`html_body` text,
	`raw` text,
	`status` text NOT NULL,
	`error` text,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `mail_dedupe_idx` ON `mail` (`dedupe_key`);--> statement-breakpoint
CREATE TABLE `modes` (
	`id` text PRIMARY KEY NOT NULL,
	`check_id` text NOT NULL,
	`frequency_hz` real NOT NULL,
	`damping_ratio` real,
	`direction` text,
	`location` text,
	`origin` text NOT NULL,
	`recording_id` text,
	FOREIGN KEY (`check_id`) REFERENCES `checks`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `modes_check_idx` ON `modes` (`check_id`);--> statement-breakpoint
CREATE TABLE `recordings` (
	`id` text PRIMARY KEY NOT NULL,
	`check_id` text,
	`asset_id` text NOT NULL,
	`sha256` text NOT NULL,
	`file_name` text NOT NULL,
	`size_bytes` integer NOT NULL,
	`media_type` text NOT NULL,
	`sample_rate_hz` real,
	`channels` integer,
	`duration_s` real,
	`analysis` text,
	`device_analysis` text,
	`analysis_differs` integer DEFAULT false NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`check_id`) REFERENCES `checks`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`asset_id`) REFERENCES `assets`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `recordings_asset_idx` ON `recordings` (`asset_id`);--> statement-breakpoint
CREATE INDEX `recordings_hash_idx` ON `recordings` (`sha256`);--> statement-breakpoint
CREATE TABLE `rule_sets` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`kind` text NOT NULL,
	`percent` real,
	`per_kind` text,
	`source` text NOT NULL,
	`edition` text DEFAULT '' NOT NULL,
	`version` integer DEFAULT 0 NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE `sessions` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`expires_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `sessions_user_idx` ON `sessions` (`user_id`);--> statement-breakpoint
CREATE TABLE `sites` (
	`id` text PRIMARY KEY NOT NULL,
	`code` text NOT NULL,
	`name` text NOT NULL,
	`recheck_days` integer DEFAULT 180 NOT NULL,
	`line_frequency_hz` real DEFAULT 60 NOT NULL,
	`version` integer DEFAULT 0 NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `sites_code_unique` ON `sites` (`code`);--> statement-breakpoint
CREATE TABLE `sync_state` (
	`id` integer PRIMARY KEY NOT NULL,
	`version` integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE `user_sites` (
	`user_id` text NOT NULL,
	`site_id` text NOT NULL,
	PRIMARY KEY(`user_id`, `site_id`),
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` text PRIMARY KEY NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`role` text NOT NULL,
	`password_hash` text NOT NULL,
	`disabled` integer DEFAULT false NOT NULL,
	`unit_system` text DEFAULT 'metric' NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_idx` ON `users` (`email`);