/**
 * Statistics for SQLite's query planner on the board's table. Without them the planner walked the
 * worst-first index through all 100,000 assets for "stale only" (92 ms) instead of reading the few
 * stale rows by their own index (0.2 ms). `PRAGMA optimize` with an `analysis_limit` estimates
 * them from a sample, which at 100,000 assets gave the same bad plan and took 5 s on the checks
 * table; a full `ANALYZE asset_status` takes about 0.1 s there (one row per asset) and is exact.
 * It runs at start and every hour, so the statistics follow the fleet as it grows.
 */
import type Database from 'better-sqlite3';

const HOUR = 3_600_000;
let timer: ReturnType<typeof setInterval> | null = null;

export function refreshPlannerStatistics(sqlite: Database.Database): void {
	sqlite.exec('ANALYZE asset_status');
}

export function startPlannerUpkeep(sqlite: Database.Database): void {
	refreshPlannerStatistics(sqlite);
	timer ??= setInterval(() => refreshPlannerStatistics(sqlite), HOUR);
	timer.unref();
}

export function stopPlannerUpkeep(): void {
	if (timer) clearInterval(timer);
	timer = null;
}
