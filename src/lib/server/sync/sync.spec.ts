import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { freshDatabase } from '../test-db.ts';
import { db } from '../db/index.ts';
import { assetStatus, assets, checks, modes, sites, users } from '../db/schema.ts';
import { update as updateUser } from '../db/users.ts';
import { setPushProbe } from './probe.ts';
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
		const again = pull(tech, r.cursor, r.scope);
		expect(again.full).toBe(false);
		expect(again.assets).toEqual([]);
	});

	it('sends an asset again after it changed, and a full sync for a cursor from the future', () => {
		const { cursor, scope } = pull(tech, 0);
		db.update(assets)
			.set({ version: cursor + 1, name: 'Raw water pump 3 (rebuilt)' })
			.where(eq(assets.id, assetId))
			.run();
		db.run(`update sync_state set version = ${cursor + 1}`);
		const delta = pull(tech, cursor, scope);
		expect(delta.assets.map((a) => a.name)).toEqual(['Raw water pump 3 (rebuilt)']);
		expect(pull(tech, cursor + 100, scope).full).toBe(true);
	});

	it('follows the user’s scope: a change of sites gives a full pull with the new sites only', () => {
		const first = pull(tech, 0);
		const larkspur = db.select().from(sites).where(eq(sites.name, 'Larkspur Board Mill')).get()!;
		const kettle = db.select().from(sites).where(eq(sites.name, 'Kettle River Water Works')).get()!;
		updateUser(tech.id, { siteIds: [larkspur.id] }, tech.id);
		const after = pull(tech, first.cursor, first.scope);
		expect(after.full, 'the tablet must replace what it holds').toBe(true);
		expect(after.scope).not.toBe(first.scope);
		expect(after.assets.length).toBeGreaterThan(5);
		expect(after.assets.every((a) => a.siteName === 'Larkspur Board Mill')).toBe(true);
		updateUser(tech.id, { siteIds: [kettle.id] }, tech.id);
		expect(pull(tech, after.cursor, after.scope).full).toBe(true);
		// a client that sends no key (an older version) is given a full pull too
		expect(pull(tech, after.cursor).full).toBe(true);
	});

	it('reports an asset that moved to a site outside the user’s scope, so the tablet forgets it', () => {
		const { cursor, scope } = pull(tech, 0);
		const larkspur = db.select().from(sites).where(eq(sites.name, 'Larkspur Board Mill')).get()!;
		const moved = demoId('asset:KRW-HLP-201');
		const prev = db.select().from(assets).where(eq(assets.id, moved)).get()!;
		db.update(assets)
			.set({ siteId: larkspur.id, version: cursor + 1 })
			.where(eq(assets.id, moved))
			.run();
		db.run(`update sync_state set version = ${cursor + 1}`);
		const delta = pull(tech, cursor, scope);
		expect(delta.full).toBe(false);
		expect(delta.deleted).toEqual([{ entity: 'asset', id: moved }]);
		expect(delta.assets.find((a) => a.id === moved)).toBeUndefined();
		db.update(assets).set({ siteId: prev.siteId }).where(eq(assets.id, moved)).run();
	});

	it('sends the latest check and the open follow-ups with each asset, and again after a new check', () => {
		const { cursor, scope } = pull(tech, 0);
		const it1 = item({ checkedAt: Date.now() + 5000 });
		push(tech, [it1]);
		const delta = pull(tech, cursor, scope);
		const a = delta.assets.find((x) => x.id === assetId)!;
		expect(a.lastCheck?.id).toBe(it1.id);
		expect(a.lastCheck?.measuredRpm).toBe(1100);
		expect(a.lastCheck?.modes.map((m) => m.frequencyHz)).toEqual([24.6]);
		expect(Array.isArray(a.openFollowUps)).toBe(true);
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
			/measuredRpm: Running speed must be greater than zero/
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
		setPushProbe(({ item: n, phase }) => {
			if (n === 2 && phase === 'before-item') throw new Error('injected');
		});
		const r = push(tech, [a, b, c]);
		setPushProbe(undefined);
		expect(r.failed).toBe(true);
		expect(r.response.results.map((x) => [x.id, x.status])).toEqual([[a.id, 'applied']]);
		expect(db.select().from(checks).where(eq(checks.id, b.id)).get()).toBeUndefined();
		const retry = push(tech, [b, c]);
		expect(retry.response.results.map((x) => x.status)).toEqual(['applied', 'applied']);
	});

	it('a failure after an item’s insert leaves nothing of that item, and its retry is applied, not a duplicate', () => {
		const a = item({ checkedAt: Date.now() + 60_000 });
		const statusBefore = db
			.select()
			.from(assetStatus)
			.where(eq(assetStatus.assetId, assetId))
			.get();
		setPushProbe(({ phase }) => {
			if (phase === 'after-insert') throw new Error('injected after the insert');
		});
		const r = push(tech, [a]);
		setPushProbe(undefined);
		expect(r.failed).toBe(true);
		expect(r.response.results, 'the answer reports nothing stored').toEqual([]);
		expect(db.select().from(checks).where(eq(checks.id, a.id)).get()).toBeUndefined();
		expect(db.select().from(modes).where(eq(modes.checkId, a.id)).all()).toEqual([]);
		expect(
			db.select().from(assetStatus).where(eq(assetStatus.assetId, assetId)).get()?.latestCheckId
		).toBe(statusBefore?.latestCheckId);
		const retry = push(tech, [a]);
		expect(retry.response.results.map((x) => x.status)).toEqual(['applied']);
		expect(
			db.select().from(assetStatus).where(eq(assetStatus.assetId, assetId)).get()?.latestCheckId,
			'the board follows the retried check'
		).toBe(a.id);
	});

	it('stores a check under the session’s user and refuses one that names another author', () => {
		const mine = item({ authorId: tech.id });
		const theirs = item({ authorId: crypto.randomUUID() });
		const r = push(tech, [mine, theirs]);
		expect(r.response.results.map((x) => x.status)).toEqual(['applied', 'rejected']);
		expect(r.response.results[1].reason).toMatch(/another user/);
		expect(db.select().from(checks).where(eq(checks.id, mine.id)).get()?.userId).toBe(tech.id);
		expect(db.select().from(checks).where(eq(checks.id, theirs.id)).get()).toBeUndefined();
	});
});
