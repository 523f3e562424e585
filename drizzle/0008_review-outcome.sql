ALTER TABLE `checks` ADD `review_outcome` text;--> statement-breakpoint
UPDATE `checks` SET `review_outcome` = CASE WHEN coalesce(`review_comment`, '') <> '' THEN 'remarks' ELSE 'fine' END WHERE `reviewed_at` IS NOT NULL;
