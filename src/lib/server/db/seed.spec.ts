import { beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { freshDatabase } from '../test-db.ts';
import { db } from './index.ts';
import { assets, excitationSources, users } from './schema.ts';
import { seed } from './seed.ts';
import { toEngineSources } from '../../schemas/excitation.ts';
import { excitationCatalogue } from '../../vibration/index.ts';

beforeAll(async () => {
	await freshDatabase();
});

const count = (t: typeof users | typeof assets | typeof excitationSources) =>
	db
		.select({ n: sql<number>`count(*)` })
		.from(t)
		.get()!.n;

describe('demo seed', () => {
	it('builds two sites with about 40 assets and one user per role, and is idempotent', async () => {
		const first = await seed(db);
		expect(first.sites).toBe(2);
		expect(first.assets).toBeGreaterThanOrEqual(36);
		const roles = db
			.select({ role: users.role })
			.from(users)
			.all()
			.map((u) => u.role);
		expect(new Set(roles)).toEqual(new Set(['technician', 'supervisor', 'planner', 'admin']));
		const before = [count(users), count(assets), count(excitationSources)];
		const second = await seed(db);
		expect(second).toEqual({ users: 0, sites: 0, assets: 0, sources: 0, checks: 0 });
		expect(first.checks).toBeGreaterThan(50);
		expect([count(users), count(assets), count(excitationSources)]).toEqual(before);
	});

	it('gives every asset excitation sources the engine accepts', () => {
		const rows = db.select().from(excitationSources).all();
		const byAsset = new Map<string, typeof rows>();
		for (const r of rows) byAsset.set(r.assetId, [...(byAsset.get(r.assetId) ?? []), r]);
		expect(byAsset.size).toBe(count(assets));
		for (const list of byAsset.values())
			expect(excitationCatalogue(toEngineSources(list)).length).toBeGreaterThan(2);
	});
});
