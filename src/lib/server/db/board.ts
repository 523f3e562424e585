/**
 * The Margin board: one row per asset from asset_status, filtered, searched, sorted and paged in
 * SQL. Stale = the latest check is older than its site's recheck interval.
 */
import { and, asc, desc, eq, inArray, or, sql, type AnyColumn, type SQL } from 'drizzle-orm';
import { db } from './index.ts';
import { areas, assetStatus, assets, sites } from './schema.ts';
import type { BoardQuery, BoardResponse, BoardRow } from '../../schemas/board.ts';

function staleExpr(now: number): SQL<number> {
	return sql<number>`(${assetStatus.staleAfter} is not null and ${assetStatus.staleAfter} < ${now})`;
}

function conditions(q: BoardQuery, now: number, scope: string[] | 'all', withVerdict: boolean): SQL | undefined {
	const c: (SQL | undefined)[] = [];
	if (scope !== 'all') c.push(scope.length ? sql`${assetStatus.siteId} in ${scope}` : sql`0`);
	if (q.site) c.push(eq(assetStatus.siteId, q.site));
	if (q.area) c.push(eq(assetStatus.areaId, q.area));
	if (q.kind) c.push(eq(assetStatus.machineKind, q.kind));
	if (withVerdict && q.verdict) c.push(eq(assetStatus.verdict, q.verdict));
	if (q.stale === 'yes') c.push(sql`${assetStatus.staleAfter} < ${now}`);
	if (q.stale === 'no') c.push(sql`(${assetStatus.staleAfter} is null or ${assetStatus.staleAfter} >= ${now})`);
	if (q.q) {
		const pattern = `%${q.q.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;
		c.push(or(sql`${assetStatus.tag} like ${pattern} escape '\\'`, sql`${assetStatus.name} like ${pattern} escape '\\'`));
	}
	return c.length ? and(...c) : undefined;
}

function ordering(q: BoardQuery): SQL[] {
	const d = q.dir === 'desc' ? desc : asc;
	// SQLite puts NULLs first when ascending; unchecked assets (no figures) go last either way
	const nullable = (col: AnyColumn): SQL[] => (q.dir === 'desc' ? [desc(col)] : [sql`${col} is null`, asc(col)]);
	switch (q.sort) {
		case 'tag':
			return [d(assetStatus.tag)];
		case 'name':
			return [d(assetStatus.name), asc(assetStatus.tag)];
		case 'site':
			return [d(assetStatus.siteId), asc(assetStatus.tag)]; // sites are few: grouped, in a stable order
		case 'checked':
			return [...nullable(assetStatus.checkedAt), asc(assetStatus.tag)];
		case 'atSpeed':
			return [...nullable(assetStatus.worstMarginAtSpeedPct), asc(assetStatus.tag)];
		case 'overRange':
			return [...nullable(assetStatus.worstMarginOverRangePct), asc(assetStatus.tag)];
		case 'verdict':
			return [q.dir === 'desc' ? asc(assetStatus.verdictRank) : desc(assetStatus.verdictRank), asc(assetStatus.tag)];
		case 'followUps':
			return [d(assetStatus.openFollowUps), asc(assetStatus.tag)];
		default:
			// worst first: verdict, then the smallest margin over the range (every checked asset has
			// one; unchecked ones rank 0 and come last), then the tag. Matches status_worst_idx.
			return [desc(assetStatus.verdictRank), asc(assetStatus.worstMarginOverRangePct), asc(assetStatus.tag)];
	}
}

/** The board columns from asset_status alone: one table, so its indexes serve filter and order. */
function base(now: number) {
	return db
		.select({
			id: assetStatus.assetId,
			tag: assetStatus.tag,
			name: assetStatus.name,
			siteId: assetStatus.siteId,
			areaId: assetStatus.areaId,
			machineKind: assetStatus.machineKind,
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
		.from(assetStatus);
}

type BaseRow = Awaited<ReturnType<ReturnType<typeof base>['all']>>[number];

const siteLookup = () => db.select({ id: sites.id, name: sites.name }).from(sites);
const areaLookup = (ids: string[]) => db.select({ id: areas.id, name: areas.name }).from(areas).where(inArray(areas.id, ids));
const speedLookup = (ids: string[]) => db.select({ id: assets.id, minRpm: assets.minRpm, maxRpm: assets.maxRpm, driveType: assets.driveType }).from(assets).where(inArray(assets.id, ids));

/** Adds site and area names and the speed range to a page of rows (small lookups). */
function complete(rows: BaseRow[]): BoardRow[] {
	if (rows.length === 0) return [];
	const siteNames = new Map(siteLookup().all().map((r) => [r.id, r.name]));
	const areaIds = [...new Set(rows.map((r) => r.areaId).filter((a): a is string => a !== null))];
	const areaNames = new Map(areaIds.length ? areaLookup(areaIds).all().map((r) => [r.id, r.name]) : []);
	const speeds = new Map(
		speedLookup(rows.map((r) => r.id))
			.all()
			.map((r) => [r.id, r])
	);
	return rows.map(({ siteId, areaId, ...r }) => {
		const sp = speeds.get(r.id);
		return { ...r, site: siteNames.get(siteId) ?? '', area: areaId ? (areaNames.get(areaId) ?? null) : null, minRpm: sp?.minRpm ?? 0, maxRpm: sp?.maxRpm ?? 0, driveType: sp?.driveType ?? 'fixed', stale: r.stale === 1 } as BoardRow;
	});
}

export function query(q: BoardQuery, scope: string[] | 'all', now = Date.now()): BoardResponse {
	const where = conditions(q, now, scope, true);
	const rows = complete(base(now).where(where).orderBy(...ordering(q)).limit(q.size).offset((q.page - 1) * q.size).all());
	const grouped = db
		.select({ verdict: assetStatus.verdict, n: sql<number>`count(*)`, stale: sql<number>`sum(${staleExpr(now)})` })
		.from(assetStatus)
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
	const rows = base(now).where(conditions(q, now, scope, true)).orderBy(...ordering(q)).all();
	const out: BoardRow[] = [];
	for (let i = 0; i < rows.length; i += 500) out.push(...complete(rows.slice(i, i + 500)));
	return out;
}

export function filterOptions() {
	return {
		sites: db.select({ id: sites.id, name: sites.name }).from(sites).orderBy(asc(sites.name)).all(),
		areas: db.select({ id: areas.id, name: areas.name, siteId: areas.siteId }).from(areas).orderBy(asc(areas.name)).all()
	};
}

/** The page-completion lookups for given row and area ids, for the benchmark's bare-SQL comparison. */
export function completionSqlOf(rowIds: string[], areaIds: string[]) {
	return [siteLookup().toSQL(), ...(areaIds.length ? [areaLookup(areaIds).toSQL()] : []), speedLookup(rowIds).toSQL()];
}

/** The two statements the board runs (rows, counts), for the benchmark's bare-SQL comparison. */
export function sqlOf(q: BoardQuery, scope: string[] | 'all', now = Date.now()) {
	return [
		base(now).where(conditions(q, now, scope, true)).orderBy(...ordering(q)).limit(q.size).offset((q.page - 1) * q.size).toSQL(),
		db
			.select({ verdict: assetStatus.verdict, n: sql<number>`count(*)`, stale: sql<number>`sum(${staleExpr(now)})` })
			.from(assetStatus)
			.where(conditions(q, now, scope, false))
			.groupBy(assetStatus.verdict)
			.toSQL()
	];
}

