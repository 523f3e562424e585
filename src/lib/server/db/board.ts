/**
 * The Margin board: one row per asset from asset_status, filtered, searched, sorted and paged in
 * SQL. Stale = the latest check is older than its site's recheck interval.
 */
import { and, asc, desc, eq, or, sql, type AnyColumn, type SQL } from 'drizzle-orm';
import { db } from './index.ts';
import { areas, assetStatus, assets, sites } from './schema.ts';
import type { BoardQuery, BoardResponse, BoardRow } from '../../schemas/board.ts';

const DAY = 86_400_000;

function staleExpr(now: number): SQL<number> {
	return sql<number>`(${assetStatus.checkedAt} is not null and ${assetStatus.checkedAt} < ${now} - ${sites.recheckDays} * ${DAY})`;
}

function conditions(q: BoardQuery, now: number, scope: string[] | 'all', withVerdict: boolean): SQL | undefined {
	const c: (SQL | undefined)[] = [];
	if (scope !== 'all') c.push(scope.length ? sql`${assets.siteId} in ${scope}` : sql`0`);
	if (q.site) c.push(eq(assets.siteId, q.site));
	if (q.area) c.push(eq(assets.areaId, q.area));
	if (q.kind) c.push(eq(assets.machineKind, q.kind));
	if (withVerdict && q.verdict) c.push(eq(assetStatus.verdict, q.verdict));
	if (q.stale === 'yes') c.push(sql`${staleExpr(now)} = 1`);
	if (q.stale === 'no') c.push(sql`${staleExpr(now)} = 0`);
	if (q.q) {
		const pattern = `%${q.q.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;
		c.push(or(sql`${assets.tag} like ${pattern} escape '\\'`, sql`${assets.name} like ${pattern} escape '\\'`));
	}
	return c.length ? and(...c) : undefined;
}

function ordering(q: BoardQuery): SQL[] {
	const d = q.dir === 'desc' ? desc : asc;
	const nullsLast = (col: AnyColumn) => sql`${col} is null`;
	switch (q.sort) {
		case 'tag':
			return [d(assets.tag)];
		case 'name':
			return [d(assets.name), asc(assets.tag)];
		case 'site':
			return [d(sites.name), asc(assets.tag)];
		case 'checked':
			return [nullsLast(assetStatus.checkedAt), d(assetStatus.checkedAt), asc(assets.tag)];
		case 'atSpeed':
			return [nullsLast(assetStatus.worstMarginAtSpeedPct), d(assetStatus.worstMarginAtSpeedPct), asc(assets.tag)];
		case 'overRange':
			return [nullsLast(assetStatus.worstMarginOverRangePct), d(assetStatus.worstMarginOverRangePct), asc(assets.tag)];
		case 'verdict':
			return [q.dir === 'desc' ? asc(assetStatus.verdictRank) : desc(assetStatus.verdictRank), asc(assets.tag)];
		case 'followUps':
			return [d(assetStatus.openFollowUps), asc(assets.tag)];
		default:
			// worst first: verdict, then the smallest margin over the range, then the tag
			return [desc(assetStatus.verdictRank), nullsLast(assetStatus.worstMarginOverRangePct), asc(assetStatus.worstMarginOverRangePct), asc(assets.tag)];
	}
}

function base(now: number) {
	return db
		.select({
			id: assets.id,
			tag: assets.tag,
			name: assets.name,
			site: sites.name,
			area: areas.name,
			machineKind: assets.machineKind,
			driveType: assets.driveType,
			minRpm: assets.minRpm,
			maxRpm: assets.maxRpm,
			checkedAt: assetStatus.checkedAt,
			checkedBy: assetStatus.checkedBy,
			measuredRpm: assetStatus.measuredRpm,
			worstMarginAtSpeedPct: assetStatus.worstMarginAtSpeedPct,
			worstMarginOverRangePct: assetStatus.worstMarginOverRangePct,
			worstPair: assetStatus.worstPair,
			verdict: assetStatus.verdict,
			stale: staleExpr(now),
			openFollowUps: assetStatus.openFollowUps
		})
		.from(assets)
		.innerJoin(sites, eq(sites.id, assets.siteId))
		.innerJoin(assetStatus, eq(assetStatus.assetId, assets.id))
		.leftJoin(areas, eq(areas.id, assets.areaId));
}

export function query(q: BoardQuery, scope: string[] | 'all', now = Date.now()): BoardResponse {
	const where = conditions(q, now, scope, true);
	const rows = base(now)
		.where(where)
		.orderBy(...ordering(q))
		.limit(q.size)
		.offset((q.page - 1) * q.size)
		.all()
		.map((r) => ({ ...r, stale: r.stale === 1 }) as BoardRow);
	const grouped = db
		.select({ verdict: assetStatus.verdict, n: sql<number>`count(*)`, stale: sql<number>`sum(${staleExpr(now)})` })
		.from(assets)
		.innerJoin(sites, eq(sites.id, assets.siteId))
		.innerJoin(assetStatus, eq(assetStatus.assetId, assets.id))
		.where(conditions(q, now, scope, false))
		.groupBy(assetStatus.verdict)
		.all();
	const counts = { clear: 0, tight: 0, conflict: 0, unchecked: 0 };
	let staleCount = 0;
	for (const g of grouped) {
		counts[g.verdict] = g.n;
		staleCount += g.stale ?? 0;
	}
	const total = q.verdict ? counts[q.verdict] : counts.clear + counts.tight + counts.conflict + counts.unchecked;
	return { rows, total, page: q.page, pageSize: q.size, counts, staleCount };
}

/** Every row of the filtered list, for CSV export. */
export function all(q: BoardQuery, scope: string[] | 'all', now = Date.now()): BoardRow[] {
	return base(now)
		.where(conditions(q, now, scope, true))
		.orderBy(...ordering(q))
		.all()
		.map((r) => ({ ...r, stale: r.stale === 1 }) as BoardRow);
}

export function filterOptions() {
	return {
		sites: db.select({ id: sites.id, name: sites.name }).from(sites).orderBy(asc(sites.name)).all(),
		areas: db.select({ id: areas.id, name: areas.name, siteId: areas.siteId }).from(areas).orderBy(asc(areas.name)).all()
	};
}

/** The SQL the board runs, for the benchmark's bare-SQL comparison. */
export function sqlOf(q: BoardQuery, scope: string[] | 'all', now = Date.now()) {
	return base(now).where(conditions(q, now, scope, true)).orderBy(...ordering(q)).limit(q.size).offset((q.page - 1) * q.size).toSQL();
}

