/** The built app for the benchmarks: a throw-away database, and quiet about the made-up checks. */
import { startBuiltServer, type BuiltServer } from '../support/built-server.ts';
import { checkItem } from '../support/check-item.ts';
import { DEMO_PASSWORDS } from '../../src/lib/server/db/demo-data.ts';
import type { Page } from '@playwright/test';

export { signInCookie, withDatabase } from '../support/built-server.ts';

/**
 * The benchmarks send made-up device summaries, so the server logs a difference for most checks
 * it recomputes: those lines are counted and reported once, everything else on stderr is passed on.
 */
export async function startServer(
	port: number,
	env: Record<string, string> = {}
): Promise<BuiltServer> {
	let differences = 0;
	const server = await startBuiltServer(port, {
		env,
		onStderrLine: (line) => {
			if (/^\[detune\] check \S+: device showed/.test(line)) differences++;
			else if (line.trim()) process.stderr.write(line + '\n');
		}
	});
	return {
		...server,
		async stop() {
			await server.stop();
			if (differences)
				console.log(
					`[bench] (the server logged ${differences} device/server differences of the made-up checks)`
				);
		}
	};
}

/** A made-up check for the push benchmarks: two modes that vary with `i`. */
export function benchCheck(assetId: string, rpm: number, i: number) {
	return checkItem(assetId, rpm, {
		checkedAt: Date.now() - i * 1000,
		modes: [
			{ hz: 10 + (i % 50), zeta: 0.02 },
			{ hz: 60 + (i % 30), zeta: null, direction: 'vertical' }
		]
	});
}

/**
 * Pushes `items` in batches as the tablet's outbox does and answers the checks per second; every
 * item must come back "applied".
 */
export async function pushAll(
	origin: string,
	cookie: string,
	items: unknown[],
	batch: number,
	clientId: string
): Promise<{ seconds: number; perSecond: number }> {
	const t0 = performance.now();
	let applied = 0;
	for (let i = 0; i < items.length; i += batch) {
		const res = await fetch(`${origin}/api/sync/push`, {
			method: 'POST',
			headers: { 'content-type': 'application/json', cookie, origin },
			body: JSON.stringify({ clientId, items: items.slice(i, i + batch) })
		});
		const body = await res.json();
		if (!res.ok) throw new Error(`push answered ${res.status}: ${JSON.stringify(body)}`);
		applied += body.results.filter((r: { status: string }) => r.status === 'applied').length;
	}
	const seconds = (performance.now() - t0) / 1000;
	if (applied !== items.length)
		throw new Error(`only ${applied} of ${items.length} checks applied`);
	return { seconds, perSecond: items.length / seconds };
}

/** The demo technician signs in through the form, as on a tablet, and lands on Floor check. */
export async function signInTechnician(page: Page) {
	await page.goto('/login');
	await page.getByLabel('E-mail').fill('tech@example.com');
	await page.getByLabel('Password').fill(DEMO_PASSWORDS.technician);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await page.waitForURL(/\/field/);
}
