/**
 * Pull: the assets (with their excitation sources) and rule sets a user may read, changed since the
 * client's cursor, plus deletions. The cursor is the highest change number (version) the client
 * has seen; a cursor of 0, or one older than the tombstones kept, gets a full sync.
 */
import { and, asc, eq, gt, inArray, or } from 'drizzle-orm';
import { db } from '../db/index.ts';
import { areas, assets, deletions, excitationSources, ruleSets, sites } from '../db/schema.ts';
import { currentVersion } from '../db/versions.ts';
import { visibleSiteIds } from '../db/assets.ts';
import type { PullResponse, PulledAsset } from '../../schemas/sync.ts';
import type { Role } from '../../roles.ts';

export function pull(user: { id: string; role: Role }, since: number): PullResponse {
	return db.transaction((tx) => {
		const cursor = currentVersion(tx);
		// tombstones are kept for good, so any cursor the server handed out can be served as a delta;
		// a cursor from another database (restored backup, new server) is ahead of ours: start over
		const full = since <= 0 || since > cursor;
		const scope = visibleSiteIds(user);
		const siteFilter =
			scope === 'all' ? undefined : inArray(assets.siteId, scope.length ? scope : ['-']);
		const changedSourceAssets = full
			? []
			: tx
					.selectDistinct({ id: excitationSources.assetId })
					.from(excitationSources)
					.where(gt(excitationSources.version, since))
					.all()
					.map((r) => r.id);
		const rows = tx
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
				driveRatio: assets.driveRatio,
				skipBands: assets.skipBands,
				ruleSetId: assets.ruleSetId,
				version: assets.version
			})
			.from(assets)
			.innerJoin(sites, eq(sites.id, assets.siteId))
			.leftJoin(areas, eq(areas.id, assets.areaId))
			// an asset is sent again when it, one of its sources, its site or its area changed (a rename)
			.where(
				and(
					siteFilter,
					full
						? undefined
						: or(
								gt(assets.version, since),
								gt(sites.version, since),
								gt(areas.version, since),
								changedSourceAssets.length ? inArray(assets.id, changedSourceAssets) : undefined
							)
				)
			)
			.orderBy(asc(assets.tag))
			.all();
		const ids = rows.map((r) => r.id);
		const sources = ids.length
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
		for (const s of sources) {
			const list = byAsset.get(s.assetId) ?? [];
			list.push({
				id: s.id,
				kind: s.kind,
				label: s.label,
				params: s.params as Record<string, unknown>,
				sortOrder: s.sortOrder
			});
			byAsset.set(s.assetId, list);
		}
		const rules = tx
			.select()
			.from(ruleSets)
			.where(full ? undefined : gt(ruleSets.version, since))
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
		const deleted = full
			? []
			: tx
					.select({ entity: deletions.entity, id: deletions.rowId })
					.from(deletions)
					.where(gt(deletions.version, since))
					.all()
					.filter(
						(d): d is { entity: 'asset' | 'rule_set'; id: string } =>
							d.entity === 'asset' || d.entity === 'rule_set'
					);
		return {
			cursor,
			full,
			assets: rows.map((r) => ({ ...r, sources: byAsset.get(r.id) ?? [] })),
			ruleSets: rules,
			deleted,
			serverTime: Date.now()
		};
	});
}
