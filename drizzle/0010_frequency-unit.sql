ALTER TABLE `asset_status` ADD `worst_natural_hz` real;--> statement-breakpoint
ALTER TABLE `asset_status` ADD `worst_label` text;--> statement-breakpoint
ALTER TABLE `checks` ADD `worst_natural_hz` real;--> statement-breakpoint
ALTER TABLE `checks` ADD `worst_label` text;--> statement-breakpoint
ALTER TABLE `users` ADD `frequency_unit` text DEFAULT 'Hz' NOT NULL;--> statement-breakpoint
UPDATE `checks` SET `worst_natural_hz` = CAST(substr(`worst_pair`, 1, instr(`worst_pair`, ' Hz × ') - 1) AS REAL), `worst_label` = substr(`worst_pair`, instr(`worst_pair`, ' Hz × ') + 6) WHERE instr(`worst_pair`, ' Hz × ') > 0;
--> statement-breakpoint
UPDATE `asset_status` SET `worst_natural_hz` = CAST(substr(`worst_pair`, 1, instr(`worst_pair`, ' Hz × ') - 1) AS REAL), `worst_label` = substr(`worst_pair`, instr(`worst_pair`, ' Hz × ') + 6) WHERE instr(`worst_pair`, ' Hz × ') > 0;
