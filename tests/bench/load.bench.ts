/**
 * Load over loopback with autocannon: 50 connections pushing batches of checks for 20 s (new UUIDs
 * and deliberate repeats, and now and then a malformed batch), the Margin board's latency under
 * that load, and sign-in throttling under a burst of wrong passwords. Afterwards the database must
 * hold exactly the unique checks sent.
 */
import autocannon from 'autocannon';
import { startServer, signInCookie, withDatabase } from './server.ts';
import { checkItem } from '../support/check-item.ts';
import { percentile, type Figure } from './harness.ts';

const CONNECTIONS = 50;
const SECONDS = 20;
const BATCH = 20;
const REPEATS_PER_BATCH = 4;
const BAD_EVERY = 25;
const BOARD = [
	'',
	'verdict=conflict',
	'stale=yes',
	'q=KRW',
	'sort=checked&dir=desc',
	'sort=overRange'
];

const statuses = (r: autocannon.Result): Record<string, number> =>
	Object.fromEntries(
		Object.entries(r.statusCodeStats ?? {}).map(([k, v]) => [k, Number(v.count ?? 0)])
	);

interface Ctx {
	key?: number;
	fresh?: string[];
	repeats?: number;
	expect?: number;
}

export async function loadBench(): Promise<Figure[]> {
	const server = await startServer(4319);
	try {
		const tech = await signInCookie(server.origin, 'tech@example.com', 'tech-demo-2026');
		const supervisor = await signInCookie(server.origin, 'super@example.com', 'super-demo-2026');
		const pull = await (
			await fetch(`${server.origin}/api/sync/pull?since=0`, { headers: { cookie: tech } })
		).json();
		const assets = pull.assets as { id: string; minRpm: number; maxRpm: number }[];
		const countChecks = () =>
			withDatabase(
				server.dbFile,
				(db) => (db.prepare('select count(*) as n from checks').get() as { n: number }).n
			);
		const before = countChecks();

		const item = (id: string, i: number) => {
			const a = assets[i % assets.length];
			return checkItem(a.id, (a.minRpm + a.maxRpm) / 2, {
				id,
				checkedAt: Date.now() - (i % 86_400) * 1000,
				notes: 'load test',
				modes: [{ hz: 12 + (i % 80), zeta: 0.03 }]
			});
		};
		const unanswered = new Map<number, string>(); // batches sent whose answer has not come
		const stored: string[] = []; // ids the server has answered "applied" for
		const unique = new Set<string>();
		let repeatsSent = 0;
		let unexpected = 0;
		let miscounted = 0;
		let counter = 0;
		let batches = 0;

		const boardLatencies: number[] = [];
		let loading = true;
		const boardLoop = (async () => {
			await new Promise((r) => setTimeout(r, 1000));
			for (let i = 0; loading; i++) {
				const t = performance.now();
				const r = await fetch(`${server.origin}/api/board?${BOARD[i % BOARD.length]}`, {
					headers: { cookie: supervisor }
				});
				await r.json();
				if (r.status !== 200) unexpected++;
				if (loading) boardLatencies.push(performance.now() - t);
			}
		})();

		const result = await autocannon({
			url: server.origin,
			connections: CONNECTIONS,
			duration: SECONDS,
			timeout: 30,
			requests: [
				{
					method: 'POST',
					path: '/api/sync/push',
					headers: { 'content-type': 'application/json', cookie: tech, origin: server.origin },
					setupRequest(req: { body?: string }, ctx: Ctx) {
						// (autocannon gives each pass through `requests` a fresh context: the count is ours)
						if (++batches % BAD_EVERY === 0) {
							ctx.fresh = [];
							ctx.repeats = 0;
							ctx.expect = 400;
							req.body = JSON.stringify({ clientId: 'load', items: 'not a list' });
							return req;
						}
						const fresh = Array.from(
							{ length: stored.length ? BATCH - REPEATS_PER_BATCH : BATCH },
							() => crypto.randomUUID()
						);
						const repeats = stored.length
							? Array.from(
									{ length: REPEATS_PER_BATCH },
									() => stored[Math.floor(Math.random() * stored.length)]
								)
							: [];
						ctx.key = batches;
						ctx.fresh = fresh;
						for (const id of fresh) unique.add(id);
						ctx.repeats = new Set(repeats).size === repeats.length ? repeats.length : -1;
						ctx.expect = 200;
						req.body = JSON.stringify({
							clientId: 'load',
							items: [...fresh, ...repeats].map((id) => item(id, counter++))
						});
						unanswered.set(batches, req.body);
						return req;
					},
					onResponse(status: number, body: string, ctx: Ctx) {
						unanswered.delete(ctx.key!);
						if (status !== ctx.expect) {
							unexpected++;
							return;
						}
						if (status !== 200) return;
						const results = (JSON.parse(body) as { results: { id: string; status: string }[] })
							.results;
						const applied = results.filter((r) => r.status === 'applied');
						const duplicates = results.filter((r) => r.status === 'duplicate').length;
						// every new id applied, every repeat acknowledged as a duplicate (a batch that
						// happened to draw the same old id twice is only checked for its new ids)
						if (
							applied.length !== ctx.fresh!.length ||
							(ctx.repeats! >= 0 && duplicates !== ctx.repeats)
						)
							miscounted++;
						for (const r of applied) stored.push(r.id);
						repeatsSent += Math.max(ctx.repeats!, 0);
					}
				}
			]
		} as autocannon.Options);
		loading = false;
		await boardLoop;
		// autocannon stops at the deadline without reading the last answers: those batches may or
		// may not have been stored. The client retries them, as the outbox does, and each item must
		// come back applied or duplicate.
		const retried = unanswered.size;
		for (const body of unanswered.values()) {
			const r = await fetch(`${server.origin}/api/sync/push`, {
				method: 'POST',
				headers: { 'content-type': 'application/json', cookie: tech, origin: server.origin },
				body
			});
			const answer = (await r.json()) as { results: { status: string }[] };
			if (
				r.status !== 200 ||
				answer.results.some((x) => x.status !== 'applied' && x.status !== 'duplicate')
			)
				unexpected++;
		}
		const missing =
			unique.size -
			withDatabase(
				server.dbFile,
				(db) =>
					(
						db
							.prepare(
								'select count(*) as n from checks where id in (select value from json_each(?))'
							)
							.get(JSON.stringify([...unique])) as { n: number }
					).n
			);
		const after = countChecks();
		const gained = after - before;

		// a burst of wrong passwords at one account, 20 at a time
		const login = await autocannon({
			url: `${server.origin}/login`,
			connections: 20,
			amount: 100,
			method: 'POST',
			headers: {
				'content-type': 'application/x-www-form-urlencoded',
				origin: server.origin,
				accept: 'text/html'
			},
			body: new URLSearchParams({
				email: 'planner@example.com',
				password: 'not-the-password'
			}).toString()
		});
		const loginStatuses = statuses(login);
		const judged = loginStatuses['400'] ?? 0;
		const throttled = loginStatuses['429'] ?? 0;
		const rightPassword = await fetch(`${server.origin}/login`, {
			method: 'POST',
			headers: {
				'content-type': 'application/x-www-form-urlencoded',
				origin: server.origin,
				accept: 'text/html'
			},
			body: new URLSearchParams({ email: 'planner@example.com', password: 'plan-demo-2026' }),
			redirect: 'manual'
		});

		const pushes = result.requests.total;
		return [
			{
				name: `load: push, ${CONNECTIONS} connections × ${SECONDS} s`,
				value: result.requests.average,
				unit: 'batches/s',
				note: `${pushes} requests, ${unique.size} new checks + ${repeatsSent} repeats; latency p50 ${result.latency.p50} ms, p97.5 ${result.latency.p97_5} ms, p99 ${result.latency.p99} ms`
			},
			{
				name: 'load: unexpected answers (not 2xx/expected 4xx), errors, timeouts',
				value: unexpected + result.errors + result.timeouts,
				unit: 'count',
				goal: 0,
				goalKind: 'max',
				note: `statuses ${JSON.stringify(statuses(result))}`
			},
			{
				name: 'load: batches answered with wrong applied/duplicate counts',
				value: miscounted,
				unit: 'count',
				goal: 0,
				goalKind: 'max'
			},
			{
				name: 'load: |checks stored − unique checks sent|',
				value: Math.abs(gained - unique.size) + missing,
				unit: 'count',
				goal: 0,
				goalKind: 'max',
				note: `${gained} rows added, ${unique.size} unique sent, ${missing} of them missing; ${retried} unanswered batches retried`
			},
			{
				name: 'load: board API p95 during the push load',
				value: percentile(boardLatencies, 95),
				unit: 'ms',
				note: `p50 ${percentile(boardLatencies, 50).toFixed(1)} ms over ${boardLatencies.length} requests; pushes take turns (src/lib/server/turns.ts), so a board request waits for at most the batch under way`
			},
			{
				name: 'load: wrong passwords judged in a burst of 100 (20 at once)',
				value: judged,
				unit: 'count',
				goal: 5,
				goalKind: 'max',
				note: `${throttled} refused as throttled; the right password afterwards: HTTP ${rightPassword.status}`
			}
		];
	} finally {
		await server.stop();
	}
}
