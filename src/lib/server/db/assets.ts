/** Assets and what a user may see of them. */
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { db } from './index.ts';
import { areas, assets, checks, sites, userSites } from './schema.ts';
import { withSourcesAndRule } from './asset-with-rule.ts';
import { FLEET_WIDE, type Role } from '../../roles.ts';

/** The site ids a user may read: every site for fleet-wide roles, else their assignments. */
export function visibleSiteIds(user: { id: string; role: Role }): string[] | 'all' {
	if (FLEET_WIDE.includes(user.role)) return 'all';
	return db
		.select({ siteId: userSites.siteId })
		.from(userSites)
		.where(eq(userSites.userId, user.id))
		.all()
		.map((r) => r.siteId);
}

/** Whether a site is inside a user's scope (from {@link visibleSiteIds}). */
export const inScope = (scope: string[] | 'all', siteId: string): boolean =>
	scope === 'all' || scope.includes(siteId);

export function listVisible(user: { id: string; role: Role }) {
	const scope = visibleSiteIds(user);
	if (scope !== 'all' && scope.length === 0) return [];
	return db
		.select({
			id: assets.id,
			tag: assets.tag,
			name: assets.name,
			siteId: assets.siteId,
			site: sites.name,
			area: areas.name,
			machineKind: assets.machineKind,
			driveType: assets.driveType,
			minRpm: assets.minRpm,
			maxRpm: assets.maxRpm
		})
		.from(assets)
		.innerJoin(sites, eq(sites.id, assets.siteId))
		.leftJoin(areas, eq(areas.id, assets.areaId))
		.where(scope === 'all' ? undefined : inArray(assets.siteId, scope))
		.orderBy(asc(assets.tag))
		.all();
}

export function counts() {
	const a =
		db
			.select({ n: sql<number>`count(*)` })
			.from(assets)
			.get()?.n ?? 0;
	const c =
		db
			.select({ n: sql<number>`count(*)` })
			.from(checks)
			.get()?.n ?? 0;
	return { assets: a, checks: c };
}

export function bySite(siteId: string) {
	return db
		.select()
		.from(assets)
		.where(and(eq(assets.siteId, siteId)))
		.orderBy(asc(assets.tag))
		.all();
}

export function byId(id: string) {
	return db.select().from(assets).where(eq(assets.id, id)).get();
}

/** Everything the asset sheet shows about the asset itself. */
export function sheet(id: string) {
	const found = withSourcesAndRule(db, id);
	if (!found) return null;
	const { asset } = found;
	const site = db.select().from(sites).where(eq(sites.id, asset.siteId)).get()!;
	const area = asset.areaId
		? (db.select().from(areas).where(eq(areas.id, asset.areaId)).get() ?? null)
		: null;
	return { ...found, site, area };
}
