/**
 * The Margin board API on a 10,000-asset / 200,000-check database: p50 and p95 over several
 * filter and sort combinations, through HTTP on loopback, and the ratio to the bare SQL it runs.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openDatabase, runMigrations } from '../../src/lib/server/db/client.ts';
import { seed, demoId } from '../../src/lib/server/db/seed.ts';
import { startServer, signInCookie } from './server.ts';
import { percentile, type Figure } from './harness.ts';

const ROUNDS = 20;
const COMBOS = [
	'',
	'verdict=conflict',
	'stale=yes',
	'q=BENCH-004',
	'sort=checked&dir=desc',
	'sort=overRange',
	'kind=fan&sort=tag',
	'page=40',
	'verdict=tight&sort=atSpeed&dir=desc',
	'sort=site'
];

export async function buildDatabase(file: string): Promise<void> {
	const { db, sqlite } = openDatabase(file);
	runMigrations(db);
	await seed(db);
	const site = [demoId('site:KRW'), demoId('site:LBM')];
	const tech = demoId('user:tech@example.com');
	const now = Date.now();
	const insAsset = sqlite.prepare(
		`insert into assets (id, tag, name, site_id, machine_kind, drive_type, min_rpm, max_rpm, drive_ratio, skip_bands, notes, version, created_at, updated_at) values (?, ?, ?, ?, ?, 'vfd', 600, 1800, 1, 3, '', 1, ?, ?)`
	);
	const insCheck = sqlite.prepare(
		`insert into checks (id, asset_id, user_id, checked_at, received_at, measured_rpm, notes, verdict, verdict_at_speed, worst_margin_at_speed_pct, worst_margin_over_range_pct, result_differs) values (?, ?, ?, ?, ?, ?, '', ?, ?, ?, ?, 0)`
	);
	const insStatus = sqlite.prepare(
		`insert into asset_status (asset_id, latest_check_id, checked_at, checked_by, measured_rpm, verdict, verdict_rank, worst_margin_at_speed_pct, worst_margin_over_range_pct, worst_pair, open_follow_ups, updated_at, site_id, area_id, machine_kind, tag, name, stale_after) values (?, ?, ?, 'Tomas Ferreira', ?, ?, ?, ?, ?, '24.00 Hz × 1× shaft', 0, ?, ?, null, ?, ?, ?, ?)`
	);
	const kinds = ['pump', 'fan', 'blower', 'compressor', 'motor'];
	const verdicts = ['clear', 'tight', 'conflict'] as const;
	let s = 7;
	const rnd = () => (s = (s * 48271) % 2147483647) / 2147483647;
	sqlite.transaction(() => {
		for (let i = 0; i < 10_000; i++) {
			const id = crypto.randomUUID();
			const tag = `BENCH-${String(i).padStart(5, '0')}`;
			insAsset.run(id, tag, `Bench machine ${i}`, site[i % 2], kinds[i % kinds.length], now, now);
			let latest = { id: '', at: 0, v: 'clear' as (typeof verdicts)[number], sm: 0, sr: 0, rpm: 0 };
			for (let k = 0; k < 20; k++) {
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

export async function boardBench(): Promise<Figure[]> {
	const dir = mkdtempSync(join(tmpdir(), 'detune-board-'));
	const file = join(dir, 'board.db');
	const t0 = performance.now();
	await buildDatabase(file);
	const buildS = (performance.now() - t0) / 1000;
	const server = await startServer(4318, { DATABASE_URL: file });
	try {
		const cookie = await signInCookie(server.origin, 'super@example.com', 'super-demo-2026');
		// beside each request, the same statements straight through better-sqlite3 — rows, counts
		// and the page's lookups — with no HTTP, no session check, no JSON. Interleaved, so both
		// sides see the same machine (these cores are shared and their speed drifts).
		const { sqlite } = openDatabase(file);
		const { boardQuery } = await import('../../src/lib/schemas/board.ts');
		const { sqlOf, completionSql, completionIds } =
			await import('../../src/lib/server/db/board.ts');
		// statements prepared once, as the API keeps its own prepared per query shape
		type Statement = { all: (...params: unknown[]) => unknown[] };
		const [siteLookup, areaLookup, speedLookup] = completionSql().map(
			(text) => sqlite.prepare(text) as unknown as Statement
		);
		const prepared = COMBOS.map((c) => {
			const [rowsQ, countsQ] = sqlOf(
				boardQuery.parse(Object.fromEntries(new URLSearchParams(c))),
				'all'
			);
			return {
				c,
				rows: sqlite.prepare(rowsQ.sql) as unknown as Statement,
				counts: sqlite.prepare(countsQ.sql) as unknown as Statement,
				rowsParams: rowsQ.params as unknown[],
				countsParams: countsQ.params as unknown[]
			};
		});
		const api: number[] = [];
		const bare: number[] = [];
		for (let round = 0; round < ROUNDS + 2; round++) {
			for (const p of prepared) {
				let t = performance.now();
				const r = await fetch(`${server.origin}/api/board?${p.c}`, { headers: { cookie } });
				await r.json();
				if (round > 1) api.push(performance.now() - t);
				t = performance.now();
				const rows = p.rows.all(...p.rowsParams) as {
					asset_id: string;
					site_id: string;
					area_id: string | null;
				}[];
				p.counts.all(...p.countsParams);
				const ids = completionIds(
					rows.map((r) => ({ id: r.asset_id, siteId: r.site_id, areaId: r.area_id }))
				);
				siteLookup.all(ids.sites);
				areaLookup.all(ids.areas);
				speedLookup.all(ids.assets);
				if (round > 1) bare.push(performance.now() - t);
				if (rows.length === 0) throw new Error(`no board rows for "${p.c}"`);
			}
		}
		sqlite.close();
		const p50 = percentile(api, 50);
		const p95 = percentile(api, 95);
		const bare50 = percentile(bare, 50);
		return [
			{
				name: 'board API p50 (10,000 assets, 200,000 checks)',
				value: p50,
				unit: 'ms',
				note: `${COMBOS.length} filter/sort combinations × ${ROUNDS} rounds over loopback; database built in ${buildS.toFixed(0)} s`
			},
			{ name: 'board API p95', value: p95, unit: 'ms', goal: 50, goalKind: 'max' },
			{
				name: 'board API p50 ÷ bare SQL p50',
				value: p50 / bare50,
				unit: '×',
				goal: 2,
				goalKind: 'max',
				note: `bare SQL p50 ${bare50.toFixed(2)} ms, p95 ${percentile(bare, 95).toFixed(2)} ms; HTTP, session check and JSON add ${(p50 - bare50).toFixed(1)} ms`
			}
		];
	} finally {
		await server.stop();
		rmSync(dir, { recursive: true, force: true });
	}
}
