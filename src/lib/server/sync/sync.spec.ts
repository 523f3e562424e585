import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { freshDatabase } from '../test-db.ts';
import { db } from '../db/index.ts';
import { assets, checks, modes, users } from '../db/schema.ts';
import { push } from './push.ts';
import { pull } from './pull.ts';
import { demoId } from '../db/seed.ts';

let tech: { id: string; role: 'technician' };
let assetId: string;
let otherSiteAsset: string;

beforeAll(async () => {
	await freshDatabase({ demo: true });
	tech = {
		id: db.select().from(users).where(eq(users.email, 'tech@example.com')).get()!.id,
		role: 'technician'
	};
	assetId = demoId('asset:KRW-RWP-103');
	otherSiteAsset = demoId('asset:LBM-IDF-110');
});

const item = (over: Record<string, unknown> = {}) => ({
	id: crypto.randomUUID(),
	assetId,
	checkedAt: Date.now(),
	measuredRpm: 1100,
	driveSetpointHz: null,
	notes: '',
	replacesCheckId: null,
	modes: [
		{
			frequencyHz: 24.6,
			dampingRatio: 0.03,
			direction: 'horizontal',
			location: 'Motor top',
			origin: 'typed'
		}
	],
	device: {
		verdict: 'conflict',
		verdictAtSpeed: 'clear',
		worstMarginAtSpeedPct: 34.18,
		worstMarginOverRangePct: 0
	},
	...over
});

describe('pull', () => {
	it('gives a technician the assets of their sites only, with sources, and a cursor', () => {
		const r = pull(tech, 0);
		expect(r.full).toBe(true);
		expect(r.assets.length).toBeGreaterThan(10);
		expect(r.assets.every((a) => a.siteName === 'Kettle River Water Works')).toBe(true);
		expect(r.assets[0].sources.length).toBeGreaterThan(0);
		expect(r.ruleSets.length).toBe(3);
		const again = pull(tech, r.cursor);
		expect(again.full).toBe(false);
		expect(again.assets).toEqual([]);
	});

	it('sends an asset again after it changed, and a full sync for a cursor from the future', () => {
		const { cursor } = pull(tech, 0);
		db.update(assets)
			.set({ version: cursor + 1, name: 'Raw water pump 3 (rebuilt)' })
			.where(eq(assets.id, assetId))
			.run();
		db.run(`update sync_state set version = ${cursor + 1}`);
		const delta = pull(tech, cursor);
		expect(delta.assets.map((a) => a.name)).toEqual(['Raw water pump 3 (rebuilt)']);
		expect(pull(tech, cursor + 100).full).toBe(true);
	});
});

describe('push', () => {
	it('applies new checks with the server’s verdict, and answers duplicate for the same UUID', () => {
		const a = item();
		const b = item({ measuredRpm: 1476 });
		const first = push(tech, [a, b]);
		expect(first.failed).toBe(false);
		expect(first.response.results.map((r) => r.status)).toEqual(['applied', 'applied']);
		const stored = db.select().from(checks).where(eq(checks.id, a.id)).get()!;
		expect(stored.verdict).toBe(first.response.results[0].verdict);
		expect(db.select().from(modes).where(eq(modes.checkId, a.id)).all()).toHaveLength(1);
		const again = push(tech, [a, b]);
		expect(again.response.results.map((r) => r.status)).toEqual(['duplicate', 'duplicate']);
		expect(db.select().from(checks).where(eq(checks.id, a.id)).all()).toHaveLength(1);
	});

	it('rejects a bad item with its reason and still applies the good ones', () => {
		const good = item();
		const r = push(tech, [
			item({ measuredRpm: -5 }),
			{ nonsense: true },
			item({ assetId: otherSiteAsset }),
			good
		]);
		expect(r.response.results.map((x) => x.status)).toEqual([
			'rejected',
			'rejected',
			'rejected',
			'applied'
		]);
		expect(r.response.results[0].reason).toMatch(
			/measuredRpm: measured speed must be greater than zero/
		);
		expect(r.response.results[2].reason).toMatch(/not on your sites/);
	});

	it('keeps what the device showed when it differs from the server', () => {
		const it1 = item({
			device: {
				verdict: 'clear',
				verdictAtSpeed: 'clear',
				worstMarginAtSpeedPct: 50,
				worstMarginOverRangePct: 50
			}
		});
		push(tech, [it1]);
		const row = db.select().from(checks).where(eq(checks.id, it1.id)).get()!;
		expect(row.resultDiffers).toBe(true);
		expect(row.deviceResult).toMatchObject({ verdict: 'clear' });
	});

	it('stops at a server fault: the items before it are committed, the rest are left for a retry', () => {
		const [a, b, c] = [item(), item(), item()];
		const r = push(tech, [a, b, c], { failAtItem: 2 });
		expect(r.failed).toBe(true);
		expect(r.response.results.map((x) => [x.id, x.status])).toEqual([[a.id, 'applied']]);
		expect(db.select().from(checks).where(eq(checks.id, b.id)).get()).toBeUndefined();
		const retry = push(tech, [b, c]);
		expect(retry.response.results.map((x) => x.status)).toEqual(['applied', 'applied']);
	});
});
