/**
 * Keeps asset_status (the board's row per asset) in step with checks, asset edits and rule-set
 * changes. Every function takes the caller's transaction: better-sqlite3 transactions are
 * synchronous, so the status changes with the write that causes it, or not at all.
 */
import { and, desc, eq, ne, sql } from 'drizzle-orm';
import type { Tx } from './client.ts';
import { assetStatus, assets, checks, followUps, modes, sites, users } from './schema.ts';
import { nextVersion } from './versions.ts';
import { withSourcesAndRule } from './asset-with-rule.ts';
import { computeCheck, type CheckSummary } from '../../checks/compute.ts';
import { VERDICT_RANK } from '../../vibration/index.ts';
import { zoneRank } from '../../vibration/severity.ts';

export interface StatusRow {
	latestCheckId: string | null;
	checkedAt: number | null;
	checkedBy: string | null;
	measuredRpm: number | null;
	summary: CheckSummary | null;
}

function write(tx: Tx, assetId: string, row: StatusRow, now: number): void {
	const openFollowUps =
		tx
			.select({ n: sql<number>`count(*)` })
			.from(followUps)
			.where(and(eq(followUps.assetId, assetId), ne(followUps.status, 'retested')))
			.get()?.n ?? 0;
	const s = row.summary;
	const asset = tx
		.select({
			siteId: assets.siteId,
			areaId: assets.areaId,
			machineKind: assets.machineKind,
			tag: assets.tag,
			name: assets.name,
			siteName: sites.name,
			recheckDays: sites.recheckDays
		})
		.from(assets)
		.innerJoin(sites, eq(sites.id, assets.siteId))
		.where(eq(assets.id, assetId))
		.get();
	if (!asset) return;
	// the zone is the latest check's own, as stored with it (rezoned when limits or group change)
	const severity = row.latestCheckId
		? tx
				.select({ v: checks.overallVelocityMmS, zone: checks.severityZone })
				.from(checks)
				.where(eq(checks.id, row.latestCheckId))
				.get()
		: undefined;
	const values = {
		siteId: asset.siteId,
		areaId: asset.areaId,
		machineKind: asset.machineKind,
		tag: asset.tag,
		name: asset.name,
		siteName: asset.siteName,
		staleAfter: row.checkedAt === null ? null : row.checkedAt + asset.recheckDays * 86_400_000,
		assetId,
		latestCheckId: row.latestCheckId,
		checkedAt: row.checkedAt,
		checkedBy: row.checkedBy,
		measuredRpm: row.measuredRpm,
		verdict: s?.verdict ?? ('unchecked' as const),
		verdictRank: VERDICT_RANK[s?.verdict ?? 'unchecked'],
		worstMarginAtSpeedPct: s?.worstMarginAtSpeedPct ?? null,
		worstMarginOverRangePct: s?.worstMarginOverRangePct ?? null,
		worstPair: s?.worstPair ?? null,
		worstNaturalHz: s?.worstNaturalHz ?? null,
		worstLabel: s?.worstLabel ?? null,
		openFollowUps,
		overallVelocityMmS: severity?.v ?? null,
		severityZone: severity?.zone ?? null,
		zoneRank: zoneRank(severity?.zone),
		updatedAt: now,
		version: nextVersion(tx)
	};
	tx.insert(assetStatus)
		.values(values)
		.onConflictDoUpdate({ target: assetStatus.assetId, set: values })
		.run();
}

/** An asset's latest check (by when it was taken, then when it arrived), or undefined. */
export function latestCheck(tx: Pick<Tx, 'select'>, assetId: string) {
	return tx
		.select()
		.from(checks)
		.where(eq(checks.assetId, assetId))
		.orderBy(desc(checks.checkedAt), desc(checks.receivedAt))
		.limit(1)
		.get();
}

/** Re-evaluates an asset's latest check against its current data and rule set. */
export function refreshAsset(tx: Tx, assetId: string, now = Date.now()): CheckSummary | null {
	const found = withSourcesAndRule(tx, assetId);
	if (!found) return null;
	const { asset, sources, ruleSet: rule } = found;
	const latest = latestCheck(tx, assetId);
	if (!latest) {
		write(
			tx,
			assetId,
			{ latestCheckId: null, checkedAt: null, checkedBy: null, measuredRpm: null, summary: null },
			now
		);
		return null;
	}
	const m = tx.select().from(modes).where(eq(modes.checkId, latest.id)).all();
	const by =
		tx.select({ name: users.name }).from(users).where(eq(users.id, latest.userId)).get()?.name ??
		null;
	let summary: CheckSummary | null = null;
	try {
		summary = computeCheck(
			{ ...asset, sources },
			rule,
			latest.measuredRpm,
			m.map((x) => ({ frequencyHz: x.frequencyHz, dampingRatio: x.dampingRatio }))
		).summary;
	} catch (e) {
		console.warn(
			`[detune] asset ${asset.tag}: latest check cannot be re-evaluated: ${(e as Error).message}`
		);
	}
	write(
		tx,
		assetId,
		{
			latestCheckId: latest.id,
			checkedAt: latest.checkedAt,
			checkedBy: by,
			measuredRpm: latest.measuredRpm,
			summary
		},
		now
	);
	return summary;
}

/** After a new check: the status moves only when it is the asset's latest. */
export function afterCheck(
	tx: Tx,
	assetId: string,
	check: { id: string; checkedAt: number; measuredRpm: number | null; userName: string | null },
	summary: CheckSummary,
	now = Date.now()
): void {
	const current = tx
		.select({ checkedAt: assetStatus.checkedAt })
		.from(assetStatus)
		.where(eq(assetStatus.assetId, assetId))
		.get();
	if (current?.checkedAt && current.checkedAt > check.checkedAt) return;
	write(
		tx,
		assetId,
		{
			latestCheckId: check.id,
			checkedAt: check.checkedAt,
			checkedBy: check.userName,
			measuredRpm: check.measuredRpm,
			summary
		},
		now
	);
}

/** After a rule-set change: every asset it governs. */
export function refreshRuleSet(tx: Tx, ruleSetId: string, now = Date.now()): number {
	const ids = tx
		.select({ id: assets.id })
		.from(assets)
		.where(eq(assets.ruleSetId, ruleSetId))
		.all();
	for (const { id } of ids) refreshAsset(tx, id, now);
	return ids.length;
}
