/**
 * The Margin board: one row per asset from asset_status, filtered, searched, sorted and paged in
 * SQL. Stale = the latest check is older than its site's recheck interval.
 */
import { and, asc, desc, or, sql, type AnyColumn, type SQL } from 'drizzle-orm';

import { db } from './index.ts';
import { areas, assetStatus, assets, sites } from './schema.ts';
import type { BoardQuery, BoardResponse, BoardRow } from '../../schemas/board.ts';

/**
 * Every value goes into the SQL as a named placeholder, so that one prepared statement per query
 * shape serves every call (no query building per request); `values` gives the names their values.
 */
const p = (name: string) => sql.placeholder(name);

function staleExpr(): SQL<number> {
	return sql<number>`(${assetStatus.staleAfter} is not null and ${assetStatus.staleAfter} < ${p('now')})`;
}

/** `contains` as a LIKE pattern: `%`, `_` and the escape character are searched as themselves. */
const searchPattern = (text: string) => `%${text.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;

/**
 * Three characters or more are searched in the trigram index (migration 0005: any part of a tag
 * or name, case-insensitive, as one quoted phrase so that no character has a meaning); shorter
 * text, which no trigram can hold, by LIKE over the table.
 */
const byTrigrams = (text: string) => [...text].length >= 3;
const searchPhrase = (text: string) => `"${text.replace(/"/g, '""')}"`;

function conditions(q: BoardQuery, scope: string[] | 'all', withVerdict: boolean): SQL | undefined {
	const c: (SQL | undefined)[] = [];
	if (scope !== 'all')
		c.push(
			scope.length
				? sql`${assetStatus.siteId} in (${sql.join(
						scope.map((_, i) => sql`${p(`scope${i}`)}`),
						sql`, `
					)})`
				: sql`0`
		);
	if (q.site) c.push(sql`${assetStatus.siteId} = ${p('site')}`);
	if (q.area) c.push(sql`${assetStatus.areaId} = ${p('area')}`);
	if (q.kind) c.push(sql`${assetStatus.machineKind} = ${p('kind')}`);
	if (withVerdict && q.verdict) c.push(sql`${assetStatus.verdict} = ${p('verdict')}`);
	if (q.zone === 'none') c.push(sql`${assetStatus.severityZone} is null`);
	else if (q.zone === 'CD') c.push(sql`${assetStatus.severityZone} in ('C', 'D')`);
	else if (q.zone) c.push(sql`${assetStatus.severityZone} = ${p('zone')}`);
	if (q.stale === 'yes') c.push(sql`${assetStatus.staleAfter} < ${p('now')}`);
	if (q.stale === 'no')
		c.push(sql`(${assetStatus.staleAfter} is null or ${assetStatus.staleAfter} >= ${p('now')})`);
	if (q.q && byTrigrams(q.q))
		c.push(
			sql`${assetStatus}.rowid in (select rowid from asset_search where asset_search match ${p('phrase')})`
		);
	else if (q.q)
		c.push(
			or(
				sql`${assetStatus.tag} like ${p('pattern')} escape '\\'`,
				sql`${assetStatus.name} like ${p('pattern')} escape '\\'`
			)
		);
	return c.length ? and(...c) : undefined;
}

/** The named values of a query, for its prepared statement. */
export function values(
	q: BoardQuery,
	now: number,
	scope: string[] | 'all'
): Record<string, unknown> {
	const v: Record<string, unknown> = { now, limit: q.size, offset: (q.page - 1) * q.size };
	if (scope !== 'all') scope.forEach((id, i) => (v[`scope${i}`] = id));
	if (q.site) v.site = q.site;
	if (q.area) v.area = q.area;
	if (q.kind) v.kind = q.kind;
	if (q.verdict) v.verdict = q.verdict;
	if (q.zone && q.zone !== 'none' && q.zone !== 'CD') v.zone = q.zone;
	if (q.q && byTrigrams(q.q)) v.phrase = searchPhrase(q.q);
	else if (q.q) v.pattern = searchPattern(q.q);
	return v;
}

const shapeOf = (q: BoardQuery, scope: string[] | 'all') =>
	[
		scope === 'all' ? 'all' : scope.length,
		!!q.site,
		!!q.area,
		!!q.kind,
		q.verdict ? 1 : 0,
		q.zone === 'none' || q.zone === 'CD' ? q.zone : q.zone ? 1 : 0,
		q.stale ?? '',
		q.q ? (byTrigrams(q.q) ? 'trigram' : 'like') : '',
		q.sort,
		q.dir
	].join('|');

function ordering(q: BoardQuery): SQL[] {
	const d = q.dir === 'desc' ? desc : asc;
	// unchecked assets (no figures) go last either way: SQLite puts NULLs last when descending, and
	// reads "asc nulls last" from the same plain index (status_over_range_idx and the like)
	const nullable = (col: AnyColumn): SQL[] =>
		q.dir === 'desc' ? [desc(col)] : [sql`${col} asc nulls last`];
	switch (q.sort) {
		case 'tag':
			return [d(assetStatus.tag)];
		case 'name':
			return [d(assetStatus.name), asc(assetStatus.tag)];
		case 'site':
			// by the site's name (kept in the row, status_site_name_idx), then the tag
			return [d(assetStatus.siteName), asc(assetStatus.tag)];
		case 'checked':
			return [...nullable(assetStatus.checkedAt), asc(assetStatus.tag)];
		case 'atSpeed':
			return [...nullable(assetStatus.worstMarginAtSpeedPct), asc(assetStatus.tag)];
		case 'overRange':
			return [...nullable(assetStatus.worstMarginOverRangePct), asc(assetStatus.tag)];
		case 'verdict':
			return [
				q.dir === 'desc' ? asc(assetStatus.verdictRank) : desc(assetStatus.verdictRank),
				asc(assetStatus.tag)
			];
		case 'followUps':
			return [d(assetStatus.openFollowUps), asc(assetStatus.tag)];
		case 'zone':
			// worst zone first (D … A), assets without a level last; then worst margin (status_zone_idx)
			return [
				q.dir === 'desc' ? desc(assetStatus.zoneRank) : asc(assetStatus.zoneRank),
				desc(assetStatus.verdictRank),
				asc(assetStatus.worstMarginOverRangePct),
				asc(assetStatus.tag)
			];
		default:
			// worst first: verdict, then the smallest margin over the range (every checked asset has
			// one; unchecked ones rank 0 and come last), then the tag. Matches status_worst_idx.
			return [
				desc(assetStatus.verdictRank),
				asc(assetStatus.worstMarginOverRangePct),
				asc(assetStatus.tag)
			];
	}
}

/** The board columns from asset_status alone: one table, so its indexes serve filter and order. */
function base() {
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
			worstNaturalHz: assetStatus.worstNaturalHz,
			worstLabel: assetStatus.worstLabel,
			verdict: assetStatus.verdict,
			overallVelocityMmS: assetStatus.overallVelocityMmS,
			severityZone: assetStatus.severityZone,
			stale: staleExpr(),
			openFollowUps: assetStatus.openFollowUps
		})
		.from(assetStatus);
}

type BaseRow = Awaited<ReturnType<ReturnType<typeof base>['all']>>[number];

/** The page's ids as one JSON text, so that each lookup is one statement prepared once. */
const idsIn = (col: AnyColumn) =>
	sql`${col} in (select value from json_each(${sql.placeholder('ids')}))`;
const siteLookup = () =>
	db.select({ id: sites.id, name: sites.name }).from(sites).where(idsIn(sites.id));
const areaLookup = () =>
	db.select({ id: areas.id, name: areas.name }).from(areas).where(idsIn(areas.id));
const speedLookup = () =>
	db
		.select({
			id: assets.id,
			minRpm: assets.minRpm,
			maxRpm: assets.maxRpm,
			driveType: assets.driveType
		})
		.from(assets)
		.where(idsIn(assets.id));
let lookups: {
	sites: ReturnType<ReturnType<typeof siteLookup>['prepare']>;
	areas: ReturnType<ReturnType<typeof areaLookup>['prepare']>;
	speeds: ReturnType<ReturnType<typeof speedLookup>['prepare']>;
} | null = null;

/** The three page-completion lookups, prepared once. */
export function completionLookups() {
	lookups ??= {
		sites: siteLookup().prepare(),
		areas: areaLookup().prepare(),
		speeds: speedLookup().prepare()
	};
	return lookups;
}

/** Adds site and area names and the speed range to a page of rows (three small lookups by key). */
function complete(rows: BaseRow[]): BoardRow[] {
	if (rows.length === 0) return [];
	const lookups = completionLookups();
	const { sites: siteIds, areas: areaIds, assets: assetIds } = completionIds(rows);
	const siteNames = new Map(lookups.sites.all({ ids: siteIds }).map((r) => [r.id, r.name]));
	const areaNames = new Map(lookups.areas.all({ ids: areaIds }).map((r) => [r.id, r.name]));
	const speeds = new Map(lookups.speeds.all({ ids: assetIds }).map((r) => [r.id, r]));
	return rows.map(({ siteId, areaId, ...r }) => {
		const sp = speeds.get(r.id);
		return {
			...r,
			site: siteNames.get(siteId) ?? '',
			area: areaId ? (areaNames.get(areaId) ?? null) : null,
			minRpm: sp?.minRpm ?? 0,
			maxRpm: sp?.maxRpm ?? 0,
			driveType: sp?.driveType ?? 'fixed',
			stale: r.stale === 1
		} as BoardRow;
	});
}

/** The distinct site, area and asset ids of a page, each as a JSON array. */
export function completionIds(rows: { id: string; siteId: string; areaId: string | null }[]) {
	const areaIds = new Set<string>();
	const siteIds = new Set<string>();
	for (const r of rows) {
		siteIds.add(r.siteId);
		if (r.areaId !== null) areaIds.add(r.areaId);
	}
	return {
		sites: JSON.stringify([...siteIds]),
		areas: JSON.stringify([...areaIds]),
		assets: JSON.stringify(rows.map((r) => r.id))
	};
}

function rowsStatement(q: BoardQuery, scope: string[] | 'all') {
	return base()
		.where(conditions(q, scope, true))
		.orderBy(...ordering(q))
		.limit(p('limit') as unknown as number)
		.offset(p('offset') as unknown as number);
}

function countsStatement(q: BoardQuery, scope: string[] | 'all') {
	return db
		.select({
			verdict: assetStatus.verdict,
			n: sql<number>`count(*)`,
			stale: sql<number>`sum(${staleExpr()})`
		})
		.from(assetStatus)
		.where(conditions(q, scope, false))
		.groupBy(assetStatus.verdict);
}

type Prepared = {
	rows: ReturnType<ReturnType<typeof rowsStatement>['prepare']>;
	counts: ReturnType<ReturnType<typeof countsStatement>['prepare']>;
};
const prepared = new Map<string, Prepared>();

/** The prepared rows and counts statements for this query's shape (made once per shape). */
export function statementsFor(q: BoardQuery, scope: string[] | 'all'): Prepared {
	const key = shapeOf(q, scope);
	let p = prepared.get(key);
	if (!p) {
		p = {
			rows: rowsStatement(q, scope).prepare(),
			counts: countsStatement(q, scope).prepare()
		};
		if (prepared.size > 500) prepared.clear();
		prepared.set(key, p);
	}
	return p;
}

export function query(q: BoardQuery, scope: string[] | 'all', now = Date.now()): BoardResponse {
	const st = statementsFor(q, scope);
	const v = values(q, now, scope);
	const rows = complete(st.rows.all(v));
	const grouped = st.counts.all(v);
	const counts = { clear: 0, tight: 0, conflict: 0, unchecked: 0 };
	let staleCount = 0;
	for (const g of grouped) {
		counts[g.verdict] = g.n;
		staleCount += g.stale ?? 0;
	}
	const total = q.verdict
		? counts[q.verdict]
		: counts.clear + counts.tight + counts.conflict + counts.unchecked;
	return { rows, total, page: q.page, pageSize: q.size, counts, staleCount };
}

/** Every row of the filtered list, for CSV export. */
export function all(q: BoardQuery, scope: string[] | 'all', now = Date.now()): BoardRow[] {
	const rows = base()
		.where(conditions(q, scope, true))
		.orderBy(...ordering(q))
		.all(values(q, now, scope));
	const out: BoardRow[] = [];
	for (let i = 0; i < rows.length; i += 500) out.push(...complete(rows.slice(i, i + 500)));
	return out;
}

export function filterOptions() {
	return {
		sites: db.select({ id: sites.id, name: sites.name }).from(sites).orderBy(asc(sites.name)).all(),
		areas: db
			.select({ id: areas.id, name: areas.name, siteId: areas.siteId })
			.from(areas)
			.orderBy(asc(areas.name))
			.all()
	};
}
