/**
 * Builds the invented demo scenario. Idempotent: every row has an id derived from its natural key,
 * and inserts skip rows that exist, so running it twice changes nothing.
 */
import { severityOf, storedSeverity } from './severity-zone.ts';
import { createHash } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import type { Db } from './client.ts';
import {
	areas,
	assets,
	checks,
	excitationSources,
	modes,
	ruleSets,
	sites,
	userSites,
	users
} from './schema.ts';
import { computeCheck } from '../../checks/compute.ts';
import { refreshAsset } from './status.ts';
import {
	DEMO_ASSETS,
	DEMO_PASSWORDS,
	DEMO_RULE_SETS,
	DEMO_SITES,
	DEMO_USERS
} from './demo-data.ts';
import { sourceParams } from '../../schemas/excitation.ts';
import { hashPassword } from '../auth/password.ts';
import { nextVersion } from './versions.ts';

/** A stable UUID-shaped id from a natural key, so re-seeding finds the same rows. */
export function demoId(key: string): string {
	const h = createHash('sha256').update(`detune-demo:${key}`).digest('hex');
	return `${h.slice(0, 8)}-${h.slice(8, 12)}-4${h.slice(13, 16)}-a${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

export interface SeedReport {
	users: number;
	sites: number;
	assets: number;
	sources: number;
	checks: number;
}

const DAY = 86_400_000;

/** A small seeded generator, so the demo is the same on every machine. */
function prng(seed: number) {
	let x = seed >>> 0 || 1;
	return () => {
		x ^= x << 13;
		x ^= x >>> 17;
		x ^= x << 5;
		return (x >>> 0) / 4294967296;
	};
}

export function isEmpty(db: Db): boolean {
	return (
		(db
			.select({ n: sql<number>`count(*)` })
			.from(users)
			.get()?.n ?? 0) === 0
	);
}

export async function seed(db: Db, now = Date.now()): Promise<SeedReport> {
	// hash outside the transaction: better-sqlite3 transactions must stay synchronous
	const hashes = new Map<string, string>();
	for (const u of DEMO_USERS) hashes.set(u.email, await hashPassword(DEMO_PASSWORDS[u.role]));
	const report: SeedReport = { users: 0, sites: 0, assets: 0, sources: 0, checks: 0 };
	db.transaction((tx) => {
		const version = nextVersion(tx);
		for (const s of DEMO_SITES) {
			const siteId = demoId(`site:${s.code}`);
			report.sites += tx
				.insert(sites)
				.values({
					id: siteId,
					code: s.code,
					name: s.name,
					recheckDays: s.recheckDays,
					lineFrequencyHz: s.lineFrequencyHz,
					version,
					createdAt: now,
					updatedAt: now
				})
				.onConflictDoNothing()
				.run().changes;
			for (const a of s.areas) {
				tx.insert(areas)
					.values({
						id: demoId(`area:${s.code}:${a}`),
						siteId,
						name: a,
						version,
						createdAt: now,
						updatedAt: now
					})
					.onConflictDoNothing()
					.run();
			}
		}
		for (const r of DEMO_RULE_SETS) {
			tx.insert(ruleSets)
				.values({
					id: demoId(`rule:${r.key}`),
					name: r.name,
					kind: r.kind,
					percent: r.percent,
					perKind: r.perKind,
					source: r.source,
					edition: r.edition,
					version,
					createdAt: now,
					updatedAt: now
				})
				.onConflictDoNothing()
				.run();
		}
		for (const u of DEMO_USERS) {
			const id = demoId(`user:${u.email}`);
			report.users += tx
				.insert(users)
				.values({
					id,
					email: u.email,
					name: u.name,
					role: u.role,
					passwordHash: hashes.get(u.email) as string,
					createdAt: now,
					updatedAt: now
				})
				.onConflictDoNothing()
				.run().changes;
			for (const code of u.sites)
				tx.insert(userSites)
					.values({ userId: id, siteId: demoId(`site:${code}`) })
					.onConflictDoNothing()
					.run();
		}
		for (const a of DEMO_ASSETS) {
			const assetId = demoId(`asset:${a.tag}`);
			report.assets += tx
				.insert(assets)
				.values({
					id: assetId,
					tag: a.tag,
					name: a.name,
					siteId: demoId(`site:${a.site}`),
					areaId: demoId(`area:${a.site}:${a.area}`),
					machineKind: a.machineKind,
					driveType: a.driveType,
					minRpm: a.minRpm,
					maxRpm: a.maxRpm,
					nominalRpm: a.nominalRpm,
					motorPoles: a.motorPoles,
					driveRatio: a.driveRatio,
					ruleSetId: demoId(`rule:${a.ruleSet}`),
					machineGroup: demoMachineGroup(a),
					version,
					createdAt: now,
					updatedAt: now
				})
				.onConflictDoNothing()
				.run().changes;
			a.sources.forEach((s, i) => {
				const schema = sourceParams[s.kind as keyof typeof sourceParams];
				const params = schema.parse(s.params); // the demo must satisfy the same schema as user input
				report.sources += tx
					.insert(excitationSources)
					.values({
						id: demoId(`source:${a.tag}:${i}`),
						assetId,
						kind: s.kind,
						label: s.label ?? '',
						params,
						sortOrder: i,
						version,
						createdAt: now,
						updatedAt: now
					})
					.onConflictDoNothing()
					.run().changes;
			});
		}
		report.checks = seedChecks(tx, now);
	});
	return report;
}

/** The demo's machine groups (invented): the large refiners and compressors group 1, the rest group 2. */
const demoMachineGroup = (a: (typeof DEMO_ASSETS)[number]) =>
	a.machineKind === 'refiner' || a.machineKind === 'compressor'
		? ('group1' as const)
		: ('group2' as const);

type DemoMode = {
	frequencyHz: number;
	dampingRatio: number | null;
	direction: 'horizontal' | 'vertical' | 'axial';
	location: string;
};

/**
 * The demo's natural frequencies for one check. The scenario wants a believable mix: about a
 * quarter of the assets in conflict (the frequencies as listed), a quarter tight and the rest
 * clear — the last two moved, with the engine's own remedy figures, to just outside (clear) or
 * just inside (tight) the margin the asset's rule asks.
 */
function demoModes(
	a: (typeof DEMO_ASSETS)[number],
	index: number,
	drift: number,
	evaluate: (m: DemoMode[]) => ReturnType<typeof computeCheck>
): DemoMode[] {
	const base: DemoMode[] = a.modes.map((m) => ({
		frequencyHz: +(m.hz * drift).toFixed(2),
		dampingRatio: m.zeta ?? null,
		direction: m.direction,
		location: m.location
	}));
	const target = index % 4 === 0 ? 'conflict' : index % 4 === 1 ? 'tight' : 'clear';
	if (target === 'conflict') return base;
	const remedies = evaluate(base).remedies;
	const moved = base.map((m, i) => {
		const r = remedies[i];
		if (r.clear) return m;
		const up = r.raiseTo?.frequencyHz ?? Infinity;
		const down = r.lowerTo?.frequencyHz ?? 0;
		const goUp = up - m.frequencyHz < m.frequencyHz - down;
		const edge = goUp ? up : down;
		// clear: 4 % past the edge; tight: 4 % short of it, inside the margin but more than halfway out
		const f =
			target === 'clear' ? (goUp ? edge * 1.04 : edge / 1.04) : goUp ? edge / 1.04 : edge * 1.04;
		return { ...m, frequencyHz: +f.toFixed(2) };
	});
	return moved;
}

/**
 * A few months of floor checks: most assets checked two or three times, the natural frequencies
 * drifting a little between checks, some assets never checked and some only long ago (stale).
 */
function seedChecks(tx: Parameters<Parameters<Db['transaction']>[0]>[0], now: number): number {
	const rnd = prng(2026);
	let added = 0;
	DEMO_ASSETS.forEach((a, index) => {
		if (index % 9 === 4) return; // never checked
		const assetId = demoId(`asset:${a.tag}`);
		const tech = DEMO_USERS.find((u) => u.role === 'technician' && u.sites.includes(a.site))!;
		const userId = demoId(`user:${tech.email}`);
		const sources = tx
			.select()
			.from(excitationSources)
			.where(eq(excitationSources.assetId, assetId))
			.all();
		const rs = DEMO_RULE_SETS.find((r) => r.key === a.ruleSet)!;
		const ages = index % 7 === 2 ? [200] : index % 3 === 0 ? [112, 58, 9] : [96, 21];
		ages.forEach((age, k) => {
			const id = demoId(`check:${a.tag}:${k}`);
			if (tx.select({ id: checks.id }).from(checks).where(eq(checks.id, id)).get()) return;
			const checkedAt = now - age * DAY - Math.floor(rnd() * 8 * 3_600_000);
			const rpm =
				a.minRpm === a.maxRpm
					? a.minRpm
					: Math.round(a.minRpm + (0.35 + 0.6 * rnd()) * (a.maxRpm - a.minRpm));
			const drift = 1 + (ages.length - 1 - k) * 0.012 * (rnd() - 0.3);
			const assetForCheck = { ...a, skipBands: 3, sources };
			const rule = { kind: rs.kind, percent: rs.percent, perKind: rs.perKind };
			const ms = demoModes(a, index, drift, (list) => computeCheck(assetForCheck, rule, rpm, list));
			const c = computeCheck(assetForCheck, rule, rpm, ms);
			const sm = c.summary;
			// an invented overall level on most checks (none on the oldest), mostly zones A and B
			const velocity = k === 0 && ages.length > 2 ? null : +(0.8 + 6 * rnd() ** 2).toFixed(1);
			const severity = severityOf(
				tx,
				{ ...a, machineGroup: demoMachineGroup(a) },
				rpm,
				ms.map((m) => m.frequencyHz),
				velocity
			);
			tx.insert(checks)
				.values({
					id,
					assetId,
					userId,
					checkedAt,
					receivedAt: checkedAt + 6 * 3_600_000,
					measuredRpm: rpm,
					overallVelocityMmS: velocity,
					...storedSeverity(severity),
					notes: k === ages.length - 1 ? 'Machine stopped and locked out for the bump test.' : '',
					ruleSetId: demoId(`rule:${rs.key}`),
					ruleSnapshot: { ...c.rule, name: rs.name, source: rs.source, edition: rs.edition },
					verdict: sm.verdict,
					verdictAtSpeed: sm.verdictAtSpeed,
					worstMarginAtSpeedPct: sm.worstMarginAtSpeedPct,
					worstMarginOverRangePct: sm.worstMarginOverRangePct,
					worstPair: sm.worstPair,
					worstNaturalHz: sm.worstNaturalHz,
					worstLabel: sm.worstLabel,
					result: {
						pairs: c.result.pairs,
						envelope: c.result.envelope,
						bands: c.bands.bands,
						warnings: c.bands.warnings,
						remedies: c.remedies
					} as unknown as Record<string, unknown>
				})
				.run();
			ms.forEach((m, j) =>
				tx
					.insert(modes)
					.values({
						id: demoId(`mode:${id}:${j}`),
						checkId: id,
						...m,
						origin: m.dampingRatio ? 'recording' : 'typed'
					})
					.run()
			);
			added++;
		});
	});
	// one board row per asset, once its checks are in (assets never checked included)
	for (const a of DEMO_ASSETS) refreshAsset(tx, demoId(`asset:${a.tag}`), now);
	return added;
}
