/**
 * Push throughput over loopback (500 checks, batches of 20 as the tablet sends them), and the
 * gzipped JavaScript the Floor check route loads in chromium.
 */
import { gzipSync } from 'node:zlib';
import { chromium } from '@playwright/test';
import { benchCheck, pushAll, startServer, signInCookie } from './server.ts';
import type { Figure } from './harness.ts';

export async function syncBench(): Promise<Figure[]> {
	const server = await startServer(4317);
	try {
		const cookie = await signInCookie(server.origin, 'tech@example.com', 'tech-demo-2026');
		const pull = await (
			await fetch(`${server.origin}/api/sync/pull?since=0`, { headers: { cookie } })
		).json();
		const assets = pull.assets as { id: string; minRpm: number; maxRpm: number }[];
		const items = Array.from({ length: 500 }, (_, i) => {
			const a = assets[i % assets.length];
			return benchCheck(a.id, (a.minRpm + a.maxRpm) / 2, i);
		});
		const { seconds } = await pushAll(server.origin, cookie, items, 20, 'bench');

		// the JavaScript Floor check loads, gzipped as a server or proxy would send it
		const browser = await chromium.launch({
			executablePath: '/usr/bin/chromium',
			args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking']
		});
		const context = await browser.newContext();
		await context.addCookies([
			{ name: cookie.split('=')[0], value: cookie.split('=')[1], url: server.origin }
		]);
		const page = await context.newPage();
		const scripts = new Map<string, Buffer>();
		page.on('response', async (r) => {
			const type = r.headers()['content-type'] ?? '';
			if (type.includes('javascript'))
				scripts.set(r.url(), await r.body().catch(() => Buffer.alloc(0)));
		});
		await page.goto(`${server.origin}/field`, { waitUntil: 'networkidle' });
		await browser.close();
		const gz = [...scripts.values()].reduce((n, b) => n + gzipSync(b, { level: 9 }).length, 0);
		return [
			{
				name: 'sync: push throughput, 500 checks over loopback',
				value: 500 / seconds,
				unit: 'checks/s',
				goal: 200,
				goalKind: 'min',
				note: `${seconds.toFixed(2)} s in batches of 20, server recomputing every check`
			},
			{
				name: 'Floor check: gzipped JavaScript loaded',
				value: gz / 1024,
				unit: 'KB',
				goal: 200,
				goalKind: 'max',
				note: `${scripts.size} scripts incl. the service worker`
			}
		];
	} finally {
		await server.stop();
	}
}
