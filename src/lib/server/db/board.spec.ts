import { beforeAll, describe, expect, it } from 'vitest';
import { freshDatabase } from '../test-db.ts';
import { query, all } from './board.ts';
import { boardQuery } from '../../schemas/board.ts';
import { demoId } from './seed.ts';
import { eq } from 'drizzle-orm';
import { db } from './index.ts';
import { assetStatus, sites, users } from './schema.ts';
import { updateSite } from './sites.ts';

beforeAll(async () => {
	await freshDatabase({ demo: true });
});

const q = (over: Record<string, string> = {}) => boardQuery.parse(over);

describe('the Margin board query', () => {
	it('lists every asset, worst first, with counts per verdict', () => {
		const r = query(q(), 'all');
		expect(r.total).toBe(40);
		expect(r.counts.clear + r.counts.tight + r.counts.conflict + r.counts.unchecked).toBe(40);
		const ranks = r.rows.map((x) => ['unchecked', 'clear', 'tight', 'conflict'].indexOf(x.verdict));
		expect([...ranks].sort((a, b) => b - a)).toEqual(ranks);
		const conflicts = r.rows
			.filter((x) => x.verdict === 'conflict')
			.map((x) => x.worstMarginOverRangePct ?? Infinity);
		expect([...conflicts].sort((a, b) => a - b)).toEqual(conflicts);
	});

	it('sorts by vibration zone, worst first, and filters by zone', () => {
		const r = query(q({ sort: 'zone', size: '100' }), 'all');
		const order = ['D', 'C', 'B', 'A', null];
		const ranks = r.rows.map((x) => order.indexOf(x.severityZone));
		expect([...ranks].sort((a, b) => a - b)).toEqual(ranks);
		// the demo has levels on most checks and none on some: both ends are there
		expect(r.rows.some((x) => x.severityZone !== null)).toBe(true);
		expect(r.rows.at(-1)!.severityZone).toBeNull();
		const cd = query(q({ zone: 'CD', size: '100' }), 'all').rows;
		expect(cd.every((x) => x.severityZone === 'C' || x.severityZone === 'D')).toBe(true);
		const none = query(q({ zone: 'none', size: '100' }), 'all');
		expect(none.rows.every((x) => x.severityZone === null && x.overallVelocityMmS === null)).toBe(
			true
		);
		const b = query(q({ zone: 'B', size: '100' }), 'all').rows;
		expect(b.length).toBeGreaterThan(0);
		expect(b.every((x) => x.severityZone === 'B')).toBe(true);
		expect(() => q({ zone: 'E' })).toThrow(/zone must be one of/);
	});

	it('filters by site and verdict, searches tag and name, and pages', () => {
		const site = demoId('site:KRW');
		const r = query(q({ site, verdict: 'conflict' }), 'all');
		expect(
			r.rows.every((x) => x.site === 'Kettle River Water Works' && x.verdict === 'conflict')
		).toBe(true);
		expect(r.total).toBe(r.counts.conflict);
		expect(query(q({ q: 'raw water' }), 'all').rows.map((x) => x.tag)).toEqual(
			expect.arrayContaining(['KRW-RWP-101', 'KRW-RWP-104'])
		);
		expect(query(q({ q: '%' }), 'all').total).toBe(0); // a wildcard is searched as a character
		const p1 = query(q({ size: '10' }), 'all');
		const p2 = query(q({ size: '10', page: '2' }), 'all');
		expect(p1.rows).toHaveLength(10);
		expect(p2.rows[0].id).not.toBe(p1.rows[0].id);
		expect(all(q({ site }), 'all').length).toBe(query(q({ site }), 'all').total);
	});

	it('finds any part of a tag or name, as a plain substring search over every row would', () => {
		// the oracle: every row, lower-cased String.includes; searches of 3+ characters go through
		// the trigram index (migration 0005), shorter ones through LIKE
		const every = all(q(), 'all');
		const oracle = (typed: string) => {
			const needle = q({ q: typed }).q ?? ''; // as the address is read: trimmed
			return every
				.filter((r) => [r.tag, r.name].some((t) => t.toLowerCase().includes(needle.toLowerCase())))
				.map((r) => r.tag)
				.sort();
		};
		for (const needle of ['rwp-10', 'RAW WATER', 'w', 'KR', 'pump 5', 'x"y', '%_', ' fan', 'ter p'])
			expect(
				all(q({ q: needle }), 'all')
					.map((r) => r.tag)
					.sort(),
				needle
			).toEqual(oracle(needle));
		expect(oracle('rwp-10').length).toBeGreaterThan(1);
	});

	it('finds an asset by its new name once it is renamed, and no longer by the old one', () => {
		const id = demoId('asset:KRW-RWP-101');
		const before = db.select().from(assetStatus).where(eq(assetStatus.assetId, id)).get()!;
		db.update(assetStatus)
			.set({ name: 'Zanzibar intake' })
			.where(eq(assetStatus.assetId, id))
			.run();
		try {
			expect(query(q({ q: 'zanzib' }), 'all').rows.map((r) => r.tag)).toEqual(['KRW-RWP-101']);
			expect(query(q({ q: before.name }), 'all').rows.map((r) => r.tag)).not.toContain(
				'KRW-RWP-101'
			);
		} finally {
			db.update(assetStatus).set({ name: before.name }).where(eq(assetStatus.assetId, id)).run();
		}
	});

	it('sorts by site name, not by the order of the sites’ ids', () => {
		const [a, b] = [demoId('site:KRW'), demoId('site:LBM')].sort();
		// name the site whose id sorts last so that its name sorts first
		const admin = db.select().from(users).where(eq(users.email, 'admin@example.com')).get()!.id;
		const original = db.select().from(sites).where(eq(sites.id, b)).get()!;
		updateSite(b, { name: 'Aardvark Works', recheckDays: original.recheckDays }, admin);
		try {
			const up = query(q({ sort: 'site', size: '500' }), 'all').rows;
			expect(up[0].site).toBe('Aardvark Works');
			expect(up.at(-1)!.site).toBe(db.select().from(sites).where(eq(sites.id, a)).get()!.name);
			const sameSite = up.filter((r) => r.site === 'Aardvark Works').map((r) => r.tag);
			expect([...sameSite].sort()).toEqual(sameSite);
			expect(query(q({ sort: 'site', dir: 'desc' }), 'all').rows[0].site).not.toBe(
				'Aardvark Works'
			);
		} finally {
			updateSite(b, { name: original.name, recheckDays: original.recheckDays }, admin);
		}
	});

	it('flags checks older than the site interval as stale, and filters on it', () => {
		const stale = query(q({ stale: 'yes' }), 'all');
		expect(stale.total).toBeGreaterThan(0);
		expect(stale.rows.every((x) => x.stale)).toBe(true);
		expect(query(q({ stale: 'no' }), 'all').rows.every((x) => !x.stale)).toBe(true);
	});

	it('sorts by a column both ways and keeps a technician to their sites', () => {
		const asc = query(q({ sort: 'tag' }), 'all').rows.map((x) => x.tag);
		const desc = query(q({ sort: 'tag', dir: 'desc' }), 'all').rows.map((x) => x.tag);
		expect(asc).toEqual([...asc].sort());
		expect(desc).toEqual([...asc].sort().reverse().slice(0, desc.length));
		expect(
			query(q(), [demoId('site:LBM')]).rows.every((x) => x.site === 'Larkspur Board Mill')
		).toBe(true);
	});

	it('refuses bad parameters with a message', () => {
		expect(boardQuery.safeParse({ verdict: 'awful' }).error?.issues[0].message).toMatch(
			/verdict must be one of/
		);
		expect(boardQuery.safeParse({ page: '0' }).error?.issues[0].message).toBe('page starts at 1');
		expect(boardQuery.safeParse({ nonsense: '1' }).success).toBe(false);
	});
});
