DROP TABLE `deletions`;--> statement-breakpoint
ALTER TABLE `asset_status` ADD `version` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
CREATE INDEX `status_version_idx` ON `asset_status` (`version`);