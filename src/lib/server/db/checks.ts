/** Checks and their modes. Checks are append-only: a correction is a new check that names the one it replaces. */
import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import { db } from './index.ts';
import { assets, checks, modes, users, type CheckRow } from './schema.ts';

export function exists(id: string): boolean {
	return db.select({ id: checks.id }).from(checks).where(eq(checks.id, id)).get() !== undefined;
}

export function byId(id: string): CheckRow | undefined {
	return db.select().from(checks).where(eq(checks.id, id)).get();
}

export function modesOf(checkId: string) {
	return db.select().from(modes).where(eq(modes.checkId, checkId)).all();
}

export function count(): number {
	return (
		db
			.select({ n: sql<number>`count(*)` })
			.from(checks)
			.get()?.n ?? 0
	);
}

/** The latest check of each asset, newest first (what a supervisor looks at before the full board). */
export function latestPerAsset(limit = 500) {
	const latest = db
		.select({ assetId: checks.assetId, at: sql<number>`max(${checks.checkedAt})`.as('at') })
		.from(checks)
		.groupBy(checks.assetId)
		.as('latest');
	return db
		.select({
			id: checks.id,
			assetId: checks.assetId,
			tag: assets.tag,
			name: assets.name,
			checkedAt: checks.checkedAt,
			by: users.name,
			measuredRpm: checks.measuredRpm,
			verdict: checks.verdict,
			verdictAtSpeed: checks.verdictAtSpeed,
			worstMarginAtSpeedPct: checks.worstMarginAtSpeedPct,
			worstMarginOverRangePct: checks.worstMarginOverRangePct,
			worstPair: checks.worstPair,
			resultDiffers: checks.resultDiffers
		})
		.from(checks)
		.innerJoin(latest, and(eq(latest.assetId, checks.assetId), eq(latest.at, checks.checkedAt)))
		.innerJoin(assets, eq(assets.id, checks.assetId))
		.innerJoin(users, eq(users.id, checks.userId))
		.orderBy(desc(checks.checkedAt))
		.limit(limit)
		.all();
}

export function forAsset(assetId: string) {
	return db
		.select()
		.from(checks)
		.where(eq(checks.assetId, assetId))
		.orderBy(desc(checks.checkedAt))
		.all();
}

export function byIds(ids: string[]) {
	return ids.length ? db.select().from(checks).where(inArray(checks.id, ids)).all() : [];
}
