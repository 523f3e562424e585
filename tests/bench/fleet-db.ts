/**
 * A made-up fleet for the benchmarks: the demo's sites, users and rule sets, then `assets`
 * machines split over the two demo sites, each with shaft and vane sources and `checksPerAsset`
 * checks over the past 400 days, and its board row. Written straight through better-sqlite3 in
 * one transaction (the app's own write path would take hours at 2,000,000 checks).
 */
import { openDatabase, runMigrations } from '../../src/lib/server/db/client.ts';
import { seed, demoId } from '../../src/lib/server/db/seed.ts';

export interface FleetSize {
	assets: number;
	checksPerAsset: number;
}

export const benchTag = (i: number) => `BENCH-${String(i).padStart(6, '0')}`;

export async function buildFleet(file: string, size: FleetSize): Promise<void> {
	const { db, sqlite } = openDatabase(file);
	runMigrations(db);
	await seed(db);
	const site = [demoId('site:KRW'), demoId('site:LBM')];
	const siteName = site.map(
		(id) => (sqlite.prepare('select name from sites where id = ?').get(id) as { name: string }).name
	);
	const tech = demoId('user:tech@example.com');
	const now = Date.now();
	const insAsset = sqlite.prepare(
		`insert into assets (id, tag, name, site_id, machine_kind, drive_type, min_rpm, max_rpm, drive_ratio, skip_bands, notes, version, created_at, updated_at) values (?, ?, ?, ?, ?, 'vfd', 600, 1800, 1, 3, '', 1, ?, ?)`
	);
	const insSource = sqlite.prepare(
		`insert into excitation_sources (id, asset_id, kind, label, params, sort_order, version, created_at, updated_at) values (?, ?, ?, '', ?, ?, 1, ?, ?)`
	);
	const insCheck = sqlite.prepare(
		`insert into checks (id, asset_id, user_id, checked_at, received_at, measured_rpm, notes, verdict, verdict_at_speed, worst_margin_at_speed_pct, worst_margin_over_range_pct, result_differs) values (?, ?, ?, ?, ?, ?, '', ?, ?, ?, ?, 0)`
	);
	const insStatus = sqlite.prepare(
		`insert into asset_status (asset_id, latest_check_id, checked_at, checked_by, measured_rpm, verdict, verdict_rank, worst_margin_at_speed_pct, worst_margin_over_range_pct, worst_pair, worst_natural_hz, worst_label, open_follow_ups, updated_at, site_id, site_name, area_id, machine_kind, tag, name, stale_after) values (?, ?, ?, 'Tomas Ferreira', ?, ?, ?, ?, ?, '24.00 Hz × 1× shaft', 24, '1× shaft', 0, ?, ?, ?, null, ?, ?, ?, ?)`
	);
	const kinds = ['pump', 'fan', 'blower', 'compressor', 'motor'];
	const verdicts = ['clear', 'tight', 'conflict'] as const;
	let s = 7;
	const rnd = () => (s = (s * 48271) % 2147483647) / 2147483647;
	sqlite.transaction(() => {
		for (let i = 0; i < size.assets; i++) {
			const id = crypto.randomUUID();
			const tag = benchTag(i);
			insAsset.run(id, tag, `Bench machine ${i}`, site[i % 2], kinds[i % kinds.length], now, now);
			insSource.run(crypto.randomUUID(), id, 'shaft', '{"orders":[1,2]}', 0, now, now);
			insSource.run(crypto.randomUUID(), id, 'vane', '{"count":5}', 1, now, now);
			let latest = { id: '', at: 0, v: 'clear' as (typeof verdicts)[number], sm: 0, sr: 0, rpm: 0 };
			for (let k = 0; k < size.checksPerAsset; k++) {
				const cid = crypto.randomUUID();
				const at = now - Math.floor(rnd() * 400) * 86_400_000;
				const v = verdicts[Math.floor(rnd() * 3)];
				const sm = rnd() * 40;
				const sr = v === 'conflict' ? rnd() * 3 : rnd() * 30;
				const rpm = 600 + rnd() * 1200;
				insCheck.run(cid, id, tech, at, at, rpm, v, v, sm, sr);
				if (at > latest.at) latest = { id: cid, at, v, sm, sr, rpm };
			}
			const recheck = i % 2 ? 120 : 180; // the two demo sites' intervals
			insStatus.run(
				id,
				latest.id,
				latest.at,
				latest.rpm,
				latest.v,
				verdicts.indexOf(latest.v) + 1,
				latest.sm,
				latest.sr,
				now,
				site[i % 2],
				siteName[i % 2],
				kinds[i % kinds.length],
				tag,
				`Bench machine ${i}`,
				latest.at + recheck * 86_400_000
			);
		}
	})();
	sqlite.pragma('optimize');
	sqlite.close();
}
