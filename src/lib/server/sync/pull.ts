/**
 * Pull: the assets (with their excitation sources, latest check and open follow-ups) and rule sets
 * a user may read, changed since the client's cursor, plus the assets that left the user's scope.
 * 1. The cursor is the highest change number (version) the client has seen.
 * 2. The scope key names what the user may read (role and sites). A client whose key differs — the
 *    user's sites or role changed, or another user's data is on the tablet — gets a full sync, and
 *    so does a cursor of 0 or one ahead of the server (a restored backup, a new server).
 * 3. Assets and rule sets are never deleted; an asset that moved to a site outside the user's
 *    scope since the cursor is reported in `deleted`, so the tablet forgets it.
 */
import { and, asc, eq, gt, inArray, ne, notInArray, or } from 'drizzle-orm';
import { sha256 } from '@oslojs/crypto/sha2';
import { encodeHexLowerCase } from '@oslojs/encoding';
import { db, type Db } from '../db/index.ts';
import {
	areas,
	assetStatus,
	assets,
	excitationSources,
	followUps,
	modes,
	ruleSets,
	sites
} from '../db/schema.ts';
import { currentVersion } from '../db/versions.ts';
import { visibleSiteIds } from '../db/assets.ts';
import { allLimits } from '../db/severity.ts';
import type { PullResponse, PulledAsset } from '../../schemas/sync.ts';
import type { Role } from '../../roles.ts';

/** A read inside the pull's one transaction. */
type Tx = Pick<Db, 'select' | 'selectDistinct'>;

/** A short digest of what the user may read: it changes when their role or sites change. */
export function scopeKey(role: Role, scope: string[] | 'all'): string {
	const text = `${role}:${scope === 'all' ? '*' : [...scope].sort().join(',')}`;
	return encodeHexLowerCase(sha256(new TextEncoder().encode(text))).slice(0, 16);
}

/** What changed since the cursor, or everything (`since` null: a full sync). */
type Since = number | null;

/** The assets in scope changed since the cursor, with their site, area and board row. */
function changedAssets(tx: Tx, since: Since, scope: string[] | 'all') {
	const siteFilter =
		scope === 'all' ? undefined : inArray(assets.siteId, scope.length ? scope : ['-']);
	const changedSourceAssets =
		since === null
			? []
			: tx
					.selectDistinct({ id: excitationSources.assetId })
					.from(excitationSources)
					.where(gt(excitationSources.version, since))
					.all()
					.map((r) => r.id);
	return (
		tx
			.select({
				id: assets.id,
				tag: assets.tag,
				name: assets.name,
				siteId: assets.siteId,
				siteName: sites.name,
				areaName: areas.name,
				machineKind: assets.machineKind,
				driveType: assets.driveType,
				minRpm: assets.minRpm,
				maxRpm: assets.maxRpm,
				nominalRpm: assets.nominalRpm,
				motorPoles: assets.motorPoles,
				slipPct: assets.slipPct,
				driveRatio: assets.driveRatio,
				skipBands: assets.skipBands,
				ruleSetId: assets.ruleSetId,
				machineGroup: assets.machineGroup,
				version: assets.version,
				latestCheckId: assetStatus.latestCheckId,
				checkedAt: assetStatus.checkedAt,
				checkedBy: assetStatus.checkedBy,
				checkedRpm: assetStatus.measuredRpm,
				verdict: assetStatus.verdict
			})
			.from(assets)
			.innerJoin(sites, eq(sites.id, assets.siteId))
			.leftJoin(areas, eq(areas.id, assets.areaId))
			.leftJoin(assetStatus, eq(assetStatus.assetId, assets.id))
			// an asset is sent again when it, one of its sources, its site or its area changed (a rename)
			.where(
				and(
					siteFilter,
					since === null
						? undefined
						: or(
								gt(assets.version, since),
								gt(sites.version, since),
								gt(areas.version, since),
								gt(assetStatus.version, since),
								changedSourceAssets.length ? inArray(assets.id, changedSourceAssets) : undefined
							)
				)
			)
			.orderBy(asc(assets.tag))
			.all()
	);
}

/** The excitation sources of these assets, in their order, by asset. */
function sourcesByAsset(tx: Tx, ids: string[]) {
	const rows = ids.length
		? tx
				.select({
					id: excitationSources.id,
					assetId: excitationSources.assetId,
					kind: excitationSources.kind,
					label: excitationSources.label,
					params: excitationSources.params,
					sortOrder: excitationSources.sortOrder
				})
				.from(excitationSources)
				.where(inArray(excitationSources.assetId, ids))
				.orderBy(asc(excitationSources.sortOrder))
				.all()
		: [];
	const byAsset = new Map<string, PulledAsset['sources']>();
	for (const { assetId, params, ...source } of rows) {
		const list = byAsset.get(assetId) ?? [];
		list.push({ ...source, params: params as Record<string, unknown> });
		byAsset.set(assetId, list);
	}
	return byAsset;
}

/** Every rule set changed since the cursor (rule sets are shared by all sites). */
function changedRuleSets(tx: Tx, since: Since) {
	return tx
		.select()
		.from(ruleSets)
		.where(since === null ? undefined : gt(ruleSets.version, since))
		.all()
		.map((r) => ({
			id: r.id,
			name: r.name,
			kind: r.kind,
			percent: r.percent,
			perKind: r.perKind ?? null,
			source: r.source,
			edition: r.edition,
			version: r.version
		}));
}

/** The assets that moved out of the user's sites since the cursor: the tablet forgets them. */
function leftScope(tx: Tx, since: Since, scope: string[] | 'all') {
	if (since === null || scope === 'all') return [];
	return tx
		.select({ id: assets.id })
		.from(assets)
		.where(and(gt(assets.version, since), notInArray(assets.siteId, scope)))
		.all()
		.map((r) => ({ entity: 'asset' as const, id: r.id }));
}

/** The modes of these checks (each asset's latest), by check. */
function modesByCheck(tx: Tx, checkIds: string[]) {
	return groupBy(
		tx
			.select({
				checkId: modes.checkId,
				frequencyHz: modes.frequencyHz,
				dampingRatio: modes.dampingRatio,
				direction: modes.direction,
				location: modes.location
			})
			.from(modes)
			.where(inArray(modes.checkId, checkIds))
			.all(),
		(m) => m.checkId
	);
}

/** The follow-ups of these assets not yet closed by a retest, soonest due first, by asset. */
function openFollowUpsByAsset(tx: Tx, ids: string[]) {
	return groupBy(
		ids.length
			? tx
					.select({
						id: followUps.id,
						assetId: followUps.assetId,
						title: followUps.title,
						status: followUps.status,
						dueDate: followUps.dueDate
					})
					.from(followUps)
					.where(and(inArray(followUps.assetId, ids), ne(followUps.status, 'retested')))
					.orderBy(asc(followUps.dueDate))
					.all()
			: [],
		(f) => f.assetId
	);
}

export function pull(
	user: { id: string; role: Role },
	since: number,
	clientScope: string | null = null
): PullResponse {
	return db.transaction((tx) => {
		const cursor = currentVersion(tx);
		const scope = visibleSiteIds(user);
		const key = scopeKey(user.role, scope);
		const full = since <= 0 || since > cursor || clientScope !== key;
		const from = full ? null : since;
		const rows = changedAssets(tx, from, scope);
		const ids = rows.map((r) => r.id);
		const sources = sourcesByAsset(tx, ids);
		const lastModes = modesByCheck(
			tx,
			rows.flatMap((r) => (r.latestCheckId ? [r.latestCheckId] : []))
		);
		const open = openFollowUpsByAsset(tx, ids);
		return {
			cursor,
			full,
			scope: key,
			assets: rows.map(
				({ latestCheckId, checkedAt, checkedBy, checkedRpm, verdict, ...r }): PulledAsset => ({
					...r,
					sources: sources.get(r.id) ?? [],
					lastCheck:
						latestCheckId && checkedAt !== null
							? {
									id: latestCheckId,
									checkedAt,
									checkedBy,
									measuredRpm: checkedRpm,
									verdict: verdict ?? 'unchecked',
									modes: (lastModes.get(latestCheckId) ?? []).map(({ checkId: _c, ...m }) => m)
								}
							: null,
					openFollowUps: (open.get(r.id) ?? []).map(({ assetId: _a, ...f }) => f)
				})
			),
			ruleSets: changedRuleSets(tx, from),
			severityLimits: allLimits(tx).map(({ updatedAt: _u, ...l }) => l),
			deleted: leftScope(tx, from, scope),
			serverTime: Date.now()
		};
	});
}

function groupBy<T>(rows: T[], key: (row: T) => string): Map<string, T[]> {
	const out = new Map<string, T[]>();
	for (const row of rows) {
		const list = out.get(key(row));
		if (list) list.push(row);
		else out.set(key(row), [row]);
	}
	return out;
}
