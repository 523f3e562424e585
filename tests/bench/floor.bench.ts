/**
 * Floor check on a tablet-class CPU: chromium's CPU slowed 4× (DevTools CPU throttling), the app
 * served by the built server on loopback. A technician signs in, opens Floor check once and waits
 * for "Ready offline"; then, offline, each reload is timed until the asset list can be used (its
 * first button visible). Also the JavaScript the page loads, gzipped, as a tablet would download it.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { chromium } from '@playwright/test';
import { startBuiltServer } from '../support/built-server.ts';
import { CHROMIUM, CHROMIUM_ARGS } from '../support/chromium.ts';
import { median, percentile, type Figure } from './harness.ts';
import { signInTechnician } from './server.ts';

const RUNS = 7;

export async function floorBench(): Promise<Figure[]> {
	const server = await startBuiltServer(4195);
	const browser = await chromium.launch({
		executablePath: CHROMIUM,
		args: CHROMIUM_ARGS
	});
	try {
		const context = await browser.newContext({
			baseURL: server.origin,
			serviceWorkers: 'allow',
			viewport: { width: 1024, height: 768 }
		});
		const page = await context.newPage();
		const scripts = new Set<string>();
		page.on('response', (r) => {
			if (r.request().resourceType() === 'script' || r.url().endsWith('.js'))
				scripts.add(new URL(r.url()).pathname);
		});
		await signInTechnician(page);
		await page
			.locator('[data-testid="ready-offline"][data-ready="true"]')
			.waitFor({ timeout: 30_000 });
		// what Floor check itself loads: one more load of the page, counting only its scripts
		scripts.clear();
		await page.reload();
		await page.getByTestId('asset-list').getByRole('button').first().waitFor();
		const gz = [...scripts]
			.filter((p) => p.startsWith('/_app/'))
			.reduce((sum, p) => sum + gzipSync(readFileSync(join('build/client', p))).length, 0);

		await context.setOffline(true);
		const cdp = await context.newCDPSession(page);
		await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 });
		const times: number[] = [];
		for (let i = 0; i < RUNS + 1; i++) {
			const t0 = Date.now();
			await page.reload();
			await page.getByTestId('asset-list').getByRole('button').first().waitFor();
			if (i > 0) times.push(Date.now() - t0); // the first reload warms chromium's code cache
		}
		await cdp.send('Emulation.setCPUThrottlingRate', { rate: 1 });
		return [
			{
				name: 'Floor check: reload to usable asset list, offline, CPU 4× slower (p50)',
				value: median(times),
				unit: 'ms',
				goal: 1000,
				note: `p90 ${percentile(times, 90)} ms over ${RUNS} reloads; 40 assets`
			},
			{
				name: 'Floor check: JavaScript it loads, gzipped',
				value: Math.round(gz / 1024),
				unit: 'KiB',
				goal: 200,
				note: `${[...scripts].filter((p) => p.startsWith('/_app/')).length} files`
			}
		];
	} finally {
		await browser.close();
		await server.stop();
	}
}
