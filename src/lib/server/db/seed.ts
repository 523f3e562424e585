/**
 * Builds the invented demo scenario. Idempotent: every row has an id derived from its natural key,
 * and inserts skip rows that exist, so running it twice changes nothing.
 */
import { createHash } from 'node:crypto';
import { sql } from 'drizzle-orm';
import type { Db } from './client.ts';
import { areas, assets, excitationSources, ruleSets, sites, userSites, users } from './schema.ts';
import { DEMO_ASSETS, DEMO_PASSWORDS, DEMO_RULE_SETS, DEMO_SITES, DEMO_USERS } from './demo-data.ts';
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
}

export function isEmpty(db: Db): boolean {
	return (db.select({ n: sql<number>`count(*)` }).from(users).get()?.n ?? 0) === 0;
}

export async function seed(db: Db, now = Date.now()): Promise<SeedReport> {
	// hash outside the transaction: better-sqlite3 transactions must stay synchronous
	const hashes = new Map<string, string>();
	for (const u of DEMO_USERS) hashes.set(u.email, await hashPassword(DEMO_PASSWORDS[u.role]));
	const report: SeedReport = { users: 0, sites: 0, assets: 0, sources: 0 };
	db.transaction((tx) => {
		const version = nextVersion(tx);
		for (const s of DEMO_SITES) {
			const siteId = demoId(`site:${s.code}`);
			report.sites += tx.insert(sites).values({ id: siteId, code: s.code, name: s.name, recheckDays: s.recheckDays, lineFrequencyHz: s.lineFrequencyHz, version, createdAt: now, updatedAt: now }).onConflictDoNothing().run().changes;
			for (const a of s.areas) {
				tx.insert(areas).values({ id: demoId(`area:${s.code}:${a}`), siteId, name: a, version, createdAt: now, updatedAt: now }).onConflictDoNothing().run();
			}
		}
		for (const r of DEMO_RULE_SETS) {
			tx.insert(ruleSets)
				.values({ id: demoId(`rule:${r.key}`), name: r.name, kind: r.kind, percent: r.percent, perKind: r.perKind, source: r.source, edition: r.edition, version, createdAt: now, updatedAt: now })
				.onConflictDoNothing()
				.run();
		}
		for (const u of DEMO_USERS) {
			const id = demoId(`user:${u.email}`);
			report.users += tx
				.insert(users)
				.values({ id, email: u.email, name: u.name, role: u.role, passwordHash: hashes.get(u.email) as string, createdAt: now, updatedAt: now })
				.onConflictDoNothing()
				.run().changes;
			for (const code of u.sites) tx.insert(userSites).values({ userId: id, siteId: demoId(`site:${code}`) }).onConflictDoNothing().run();
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
					.values({ id: demoId(`source:${a.tag}:${i}`), assetId, kind: s.kind, label: s.label ?? '', params, sortOrder: i, version, createdAt: now, updatedAt: now })
					.onConflictDoNothing()
					.run().changes;
			});
		}
	});
	return report;
}
