-- The board's default order (worst first) as an index, so SQLite reads the first page in order
-- instead of sorting every asset. Mixed directions need a hand-written index.
CREATE INDEX `status_board_default_idx` ON `asset_status` (`verdict_rank` DESC, `worst_margin_over_range_pct` ASC, `tag` ASC);
