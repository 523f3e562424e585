/**
 * The Margin board and push at 1,000, 10,000 and 100,000 assets (10,000 / 200,000 / 2,000,000
 * checks), each on a database of its own served by the built app over loopback, and how each
 * figure grows with the fleet.
 *
 * Board: 10 filter/sort combinations × 20 rounds, as a supervisor (every site); beside each
 * request the same prepared statements straight through better-sqlite3, interleaved because these
 * shared cores drift, so the ratio API ÷ bare SQL shows what HTTP, the session and JSON add.
 * Push: 500 checks in batches of 20 as a technician, each to a different machine of the site,
 * the server recomputing every check against the machine's sources and rule set.
 */
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fillPlaceholders } from 'drizzle-orm';
import { openDatabase, runMigrations } from '../../src/lib/server/db/client.ts';
import { demoId } from '../../src/lib/server/db/seed.ts';
import { buildFleet, type FleetSize } from './fleet-db.ts';
import { benchCheck, pushAll, startServer, signInCookie } from './server.ts';
import { percentile, type Figure } from './harness.ts';

const SIZES: FleetSize[] = [
	{ assets: 1_000, checksPerAsset: 10 },
	{ assets: 10_000, checksPerAsset: 20 },
	{ assets: 100_000, checksPerAsset: 20 }
];
const ROUNDS = 20;
const PUSHED = 500;
const BATCH = 20;
/** Filter and sort combinations; one page halfway down the list, whatever the fleet's size. */
const combos = (size: FleetSize) => [
	'',
	'verdict=conflict',
	'stale=yes',
	'q=BENCH-0004',
	'sort=checked&dir=desc',
	'sort=overRange',
	'kind=fan&sort=tag',
	`page=${Math.max(1, Math.floor(size.assets / 100))}`,
	'verdict=tight&sort=atSpeed&dir=desc',
	'sort=site'
];

interface Measured {
	size: FleetSize;
	buildS: number;
	fileMb: number;
	p50: number;
	p95: number;
	bare50: number;
	bare95: number;
	slowest: string;
	floor50: number;
	pushPerS: number;
}

type Statement = { all: (...params: unknown[]) => unknown[] };

async function measureBoard(origin: string, cookie: string, file: string, size: FleetSize) {
	const { sqlite } = openDatabase(file);
	const { boardQuery } = await import('../../src/lib/schemas/board.ts');
	const board = await import('../../src/lib/server/db/board.ts');
	// the board module prepares on this process's own (in-memory) database: it needs the tables
	runMigrations((await import('../../src/lib/server/db/index.ts')).db);
	const now = Date.now();
	// the API's own prepared statements, their SQL and placeholders read back and run here
	const lookups = board.completionLookups();
	const [siteLookup, areaLookup, speedLookup] = [lookups.sites, lookups.areas, lookups.speeds].map(
		(st) => sqlite.prepare(st.getQuery().sql) as unknown as Statement
	);
	const prepared = combos(size).map((c) => {
		const q = boardQuery.parse(Object.fromEntries(new URLSearchParams(c)));
		const st = board.statementsFor(q, 'all');
		const v = board.values(q, now, 'all');
		const rows = st.rows.getQuery();
		const counts = st.counts.getQuery();
		return {
			c,
			rows: sqlite.prepare(rows.sql) as unknown as Statement,
			counts: sqlite.prepare(counts.sql) as unknown as Statement,
			rowsParams: fillPlaceholders(rows.params, v),
			countsParams: fillPlaceholders(counts.params, v)
		};
	});
	const api: number[] = [];
	const bare: number[] = [];
	const byCombo = new Map<string, number[]>();
	const floor: number[] = []; // a signed-in request that does next to nothing: /api/session
	try {
		for (let round = 0; round < ROUNDS + 2; round++) {
			for (const p of prepared) {
				let t = performance.now();
				const r = await fetch(`${origin}/api/board?${p.c}`, { headers: { cookie } });
				const body = await r.json();
				if (round > 1) {
					api.push(performance.now() - t);
					byCombo.set(p.c, [...(byCombo.get(p.c) ?? []), performance.now() - t]);
				}
				if (!r.ok || !Array.isArray(body.rows) || body.rows.length === 0)
					throw new Error(`no board rows for "${p.c}" (${r.status})`);
				t = performance.now();
				await (await fetch(`${origin}/api/session`, { headers: { cookie } })).text();
				if (round > 1) floor.push(performance.now() - t);
				t = performance.now();
				const rows = p.rows.all(...p.rowsParams) as {
					asset_id: string;
					site_id: string;
					area_id: string | null;
				}[];
				p.counts.all(...p.countsParams);
				const ids = board.completionIds(
					rows.map((r) => ({ id: r.asset_id, siteId: r.site_id, areaId: r.area_id }))
				);
				siteLookup.all(ids.sites);
				areaLookup.all(ids.areas);
				speedLookup.all(ids.assets);
				if (round > 1) bare.push(performance.now() - t);
			}
		}
	} finally {
		sqlite.close();
	}
	const [slowest, times] = [...byCombo].sort(
		(a, b) => percentile(b[1], 50) - percentile(a[1], 50)
	)[0];
	return {
		api,
		bare,
		floor,
		slowest: `${slowest || '(default)'} p50 ${percentile(times, 50).toFixed(1)} ms`
	};
}

async function measurePush(origin: string, cookie: string, file: string): Promise<number> {
	// machines of the technician's site, spread over the whole fleet
	const { sqlite } = openDatabase(file);
	const ids = (
		sqlite
			.prepare(`select id from assets where site_id = ? and tag like 'BENCH-%' order by tag`)
			.all(demoId('site:KRW')) as { id: string }[]
	).map((r) => r.id);
	sqlite.close();
	const step = Math.max(1, Math.floor(ids.length / PUSHED));
	const items = Array.from({ length: PUSHED }, (_, i) =>
		benchCheck(ids[(i * step) % ids.length], 600 + (i % 120) * 10, i)
	);
	return (await pushAll(origin, cookie, items, BATCH, 'bench-scale')).perSecond;
}

async function measure(size: FleetSize, port: number): Promise<Measured> {
	const dir = mkdtempSync(join(tmpdir(), 'detune-scale-'));
	const file = join(dir, 'fleet.db');
	try {
		const t0 = performance.now();
		await buildFleet(file, size);
		const buildS = (performance.now() - t0) / 1000;
		const fileMb = statSync(file).size / 1048576;
		const server = await startServer(port, { DATABASE_URL: file });
		try {
			const supervisor = await signInCookie(server.origin, 'super@example.com', 'super-demo-2026');
			const tech = await signInCookie(server.origin, 'tech@example.com', 'tech-demo-2026');
			const { api, bare, floor, slowest } = await measureBoard(
				server.origin,
				supervisor,
				file,
				size
			);
			const pushPerS = await measurePush(server.origin, tech, file);
			return {
				size,
				buildS,
				fileMb,
				p50: percentile(api, 50),
				p95: percentile(api, 95),
				bare50: percentile(bare, 50),
				bare95: percentile(bare, 95),
				slowest,
				floor50: percentile(floor, 50),
				pushPerS
			};
		} finally {
			await server.stop();
		}
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

const label = (s: FleetSize) =>
	`${s.assets.toLocaleString('en')} assets, ${(s.assets * s.checksPerAsset).toLocaleString('en')} checks`;

export async function scaleBench(
	sizes: FleetSize[] = SIZES,
	log: (line: string) => void = console.log
): Promise<Figure[]> {
	const runs: Measured[] = [];
	for (const [i, size] of sizes.entries()) {
		log(`[bench]   ${label(size)} …`);
		const m = await measure(size, 4320 + i);
		log(
			`[bench]   built in ${m.buildS.toFixed(0)} s (${m.fileMb.toFixed(0)} MB); board p95 ${m.p95.toFixed(1)} ms, push ${m.pushPerS.toFixed(0)} checks/s`
		);
		runs.push(m);
		globalThis.gc?.();
	}
	const figures: Figure[] = [];
	const first = runs[0];
	const last = runs[runs.length - 1];
	for (const m of runs) {
		const biggest = m === last;
		figures.push(
			{
				name: `board API p50 (${label(m.size)})`,
				value: m.p50,
				unit: 'ms',
				note: `bare SQL p50 ${m.bare50.toFixed(2)} ms; database ${m.fileMb.toFixed(0)} MB, built in ${m.buildS.toFixed(0)} s`
			},
			{
				name: `board API p95 (${label(m.size)})`,
				value: m.p95,
				unit: 'ms',
				...(biggest || m.size.assets === 10_000 ? { goal: 50, goalKind: 'max' as const } : {}),
				note: `bare SQL p95 ${m.bare95.toFixed(2)} ms; slowest ${m.slowest}`
			},
			{
				name: `board API p50 ÷ bare SQL p50 (${m.size.assets.toLocaleString('en')} assets)`,
				value: m.p50 / m.bare50,
				unit: '×',
				...(m.size.assets === 10_000 ? { goal: 2, goalKind: 'max' as const } : {}),
				note: `HTTP, session check and JSON add ${(m.p50 - m.bare50).toFixed(1)} ms, of which ${m.floor50.toFixed(1)} ms any signed-in request costs (/api/session p50)`
			},
			{
				name: `push throughput (${label(m.size)})`,
				value: m.pushPerS,
				unit: 'checks/s',
				...(biggest ? { goal: 200, goalKind: 'min' as const } : {}),
				note: `${PUSHED} checks in batches of ${BATCH}, each recomputed`
			}
		);
	}
	if (runs.length > 1) {
		const times = last.size.assets / first.size.assets;
		figures.push(
			{
				name: `growth: board p95, ${first.size.assets.toLocaleString('en')} → ${last.size.assets.toLocaleString('en')} assets`,
				value: last.p95 / first.p95,
				unit: '×',
				note: `for ${times}× the assets; ${runs.map((m) => m.p95.toFixed(1)).join(' → ')} ms`
			},
			{
				name: `growth: push throughput, ${first.size.assets.toLocaleString('en')} → ${last.size.assets.toLocaleString('en')} assets`,
				value: last.pushPerS / first.pushPerS,
				unit: '×',
				note: `${runs.map((m) => m.pushPerS.toFixed(0)).join(' → ')} checks/s`
			}
		);
	}
	return figures;
}
