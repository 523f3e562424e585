import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { freshDatabase } from '../test-db.ts';
import { db } from './index.ts';
import { assetStatus, auditLog, sites, users } from './schema.ts';
import * as siteQueries from './sites.ts';
import * as board from './board.ts';
import { boardQuery } from '../../schemas/board.ts';
import { pull } from '../sync/pull.ts';

let admin: string;
let tech: { id: string; role: 'technician' };
let krw: { id: string; recheckDays: number };

beforeAll(async () => {
	await freshDatabase({ demo: true });
	admin = db.select().from(users).where(eq(users.email, 'admin@example.com')).get()!.id;
	tech = {
		id: db.select().from(users).where(eq(users.email, 'tech@example.com')).get()!.id,
		role: 'technician'
	};
	krw = db.select().from(sites).where(eq(sites.code, 'KRW')).get()!;
});

const staleOnBoard = (siteId: string) =>
	board.query(boardQuery.parse({ site: siteId, size: '500' }), 'all').staleCount;

describe('sites and areas', () => {
	it('a shorter recheck interval flags more checks stale on the board, at once', () => {
		const before = staleOnBoard(krw.id);
		const r = siteQueries.updateSite(
			krw.id,
			{ name: 'Kettle River Water Works', recheckDays: 7 },
			admin
		);
		expect(r.changed).toBe(true);
		expect(r.restaled).toBeGreaterThan(0);
		const after = staleOnBoard(krw.id);
		expect(after).toBeGreaterThan(before);
		// every checked asset's stale date is its check + 7 days
		for (const row of db.select().from(assetStatus).where(eq(assetStatus.siteId, krw.id)).all()) {
			if (row.checkedAt !== null) expect(row.staleAfter).toBe(row.checkedAt + 7 * 86_400_000);
		}
		siteQueries.updateSite(
			krw.id,
			{ name: 'Kettle River Water Works', recheckDays: krw.recheckDays },
			admin
		);
		expect(staleOnBoard(krw.id)).toBe(before);
	});

	it('a rename reaches the tablets in the next pull, and is in the audit log', () => {
		const { cursor, scope } = pull(tech, 0);
		siteQueries.updateSite(
			krw.id,
			{ name: 'Kettle River Water Works (North)', recheckDays: krw.recheckDays },
			admin
		);
		const delta = pull(tech, cursor, scope);
		expect(delta.full).toBe(false);
		expect(delta.assets.length).toBeGreaterThan(0);
		expect(delta.assets.every((a) => a.siteName === 'Kettle River Water Works (North)')).toBe(true);
		const entry = db.select().from(auditLog).where(eq(auditLog.entityId, krw.id)).all().at(-1)!;
		expect(entry.before).toMatchObject({ name: 'Kettle River Water Works' });
		expect(entry.after).toMatchObject({ name: 'Kettle River Water Works (North)' });
	});

	it('refuses a second site with the same code and a second area with the same name', () => {
		expect(() =>
			siteQueries.createSite({ code: 'KRW', name: 'Another', recheckDays: 90 }, admin)
		).toThrow(/KRW is taken/);
		const id = siteQueries.createSite(
			{ code: 'OSP', name: 'Otter Springs Pumping', recheckDays: 90 },
			admin
		);
		siteQueries.createArea(id, 'Intake', admin);
		expect(() => siteQueries.createArea(id, 'intake', admin)).toThrow(/already has an area called/);
		const second = siteQueries.createArea(id, 'Outfall', admin);
		expect(() => siteQueries.renameArea(second, 'INTAKE', admin)).toThrow(
			/already has an area called/
		);
		expect(siteQueries.renameArea(second, 'Outfall works', admin)).toBe(true);
		expect(
			siteQueries
				.list()
				.find((s) => s.id === id)
				?.areas.map((a) => a.name)
		).toEqual(['Intake', 'Outfall works']);
	});

	it('says so when the site or area is gone', () => {
		expect(() =>
			siteQueries.updateSite('no-such-site', { name: 'X site', recheckDays: 30 }, admin)
		).toThrow(/does not exist/);
		expect(() => siteQueries.renameArea('no-such-area', 'Somewhere', admin)).toThrow(
			/does not exist/
		);
	});
});
