-- The board's search (any part of a tag or name) through a trigram full-text index kept beside
-- asset_status by triggers, so a search reads the matching rows instead of every asset. Every
-- status write sets tag and name; the index changes only when one of them really changes.
CREATE VIRTUAL TABLE `asset_search` USING fts5(`tag`, `name`, content='asset_status', content_rowid='rowid', tokenize='trigram');
--> statement-breakpoint
CREATE TRIGGER `asset_search_ai` AFTER INSERT ON `asset_status` BEGIN
	INSERT INTO `asset_search` (rowid, `tag`, `name`) VALUES (new.rowid, new.`tag`, new.`name`);
END;
--> statement-breakpoint
CREATE TRIGGER `asset_search_ad` AFTER DELETE ON `asset_status` BEGIN
	INSERT INTO `asset_search` (`asset_search`, rowid, `tag`, `name`) VALUES ('delete', old.rowid, old.`tag`, old.`name`);
END;
--> statement-breakpoint
CREATE TRIGGER `asset_search_au` AFTER UPDATE OF `tag`, `name` ON `asset_status`
	WHEN old.`tag` IS NOT new.`tag` OR old.`name` IS NOT new.`name` BEGIN
	INSERT INTO `asset_search` (`asset_search`, rowid, `tag`, `name`) VALUES ('delete', old.rowid, old.`tag`, old.`name`);
	INSERT INTO `asset_search` (rowid, `tag`, `name`) VALUES (new.rowid, new.`tag`, new.`name`);
END;
--> statement-breakpoint
INSERT INTO `asset_search` (`asset_search`) VALUES ('rebuild');
