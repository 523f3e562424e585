/**
 * Tablets on the plant network reach Detune by a host name, not 127.0.0.1, so their browser
 * applies the secure-context rules that loopback is spared. Here chromium maps the plant-style
 * name detune.plant.test to this machine's loopback (--host-resolver-rules: traffic never leaves
 * it) and trusts a certificate authority the way a managed tablet does: in its NSS database
 * (certutil, Debian's libnss3-tools), never with --ignore-certificate-errors.
 */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type Browser } from '@playwright/test';
import { expect, test } from './fixtures.ts';
import { startBuiltServer, type BuiltServer } from '../support/built-server.ts';
import { outboxCount, openFieldOnline, saveChecks, syncAll } from './floor.ts';
import { CHROMIUM, CHROMIUM_ARGS } from '../support/chromium.ts';

const HOST = 'detune.plant.test';

/** A HOME whose NSS database trusts `caFile` as a certificate authority. */
function homeTrusting(caFile: string): string {
	const home = mkdtempSync(join(tmpdir(), 'detune-tablet-'));
	const db = join(home, '.pki', 'nssdb');
	mkdirSync(db, { recursive: true });
	execFileSync('certutil', ['-d', `sql:${db}`, '-N', '--empty-password']);
	execFileSync('certutil', ['-d', `sql:${db}`, '-A', '-t', 'C,,', '-n', 'plant-ca', '-i', caFile]);
	return home;
}

function tablet(home?: string): Promise<Browser> {
	return chromium.launch({
		executablePath: CHROMIUM,
		env: { ...process.env, ...(home ? { HOME: home } : {}) },
		args: [...CHROMIUM_ARGS, `--host-resolver-rules=MAP ${HOST} 127.0.0.1`]
	});
}

/** Signs in, opens Floor check once, saves a check offline and syncs it back online. */
async function offlineShift(browser: Browser, origin: string, tag: string) {
	const context = await browser.newContext({ baseURL: origin, serviceWorkers: 'allow' });
	const page = await context.newPage();
	await openFieldOnline(page, 'technician');
	expect(await page.evaluate(() => window.isSecureContext)).toBe(true);
	expect(await page.evaluate(() => !!navigator.serviceWorker.controller)).toBe(true);
	const cookie = (await context.cookies()).find((c) => c.name === 'detune_session');
	expect(cookie?.secure, 'the session cookie is Secure on HTTPS').toBe(true);
	await context.setOffline(true);
	await page.reload();
	await saveChecks(page, [tag]);
	await expect.poll(() => outboxCount(page)).toBe(1);
	await context.setOffline(false);
	await syncAll(page);
	await context.close();
}

test('built-in HTTPS with its own local CA: a tablet that trusts the CA signs in, goes offline, saves a check and syncs it', async () => {
	test.setTimeout(120_000);
	const dir = mkdtempSync(join(tmpdir(), 'detune-https-'));
	const origin = `https://${HOST}:4443`;
	const server = await startBuiltServer(4442, {
		dir,
		env: {
			PORT: '4442',
			HTTPS_PORT: '4443',
			ORIGIN: origin,
			TLS_DIR: join(dir, 'tls'),
			TLS_HOSTS: '10.20.0.5'
		},
		entry: {
			script: 'serve-https.js',
			origin,
			health: 'http://127.0.0.1:4442/setup/certificate'
		}
	});
	let browser: Browser | null = null;
	try {
		// plain HTTP only redirects, but serves the certificate page a tablet needs first
		const plain = await fetch('http://127.0.0.1:4442/field', { redirect: 'manual' });
		expect(
			plain.status,
			await plain
				.clone()
				.text()
				.then((t) => t.slice(0, 300))
		).toBe(308);
		expect(plain.headers.get('location')).toBe(`${origin}/field`);
		const ca = await fetch('http://127.0.0.1:4442/setup/certificate/detune-ca.crt');
		expect(ca.status).toBe(200);
		expect(await ca.text()).toContain('BEGIN CERTIFICATE');
		const caFile = join(dir, 'tls', 'ca.crt');
		expect(existsSync(join(dir, 'tls', 'ca.key'))).toBe(true);
		browser = await tablet(homeTrusting(caFile));
		await offlineShift(browser, origin, 'KRW-HLP-202');
	} finally {
		await browser?.close();
		await server.stop();
		rmSync(dir, { recursive: true, force: true });
	}
});

test('behind the shipped Caddy config (tls internal): sign-in and sync through the proxy', async () => {
	test.setTimeout(120_000);
	const dir = mkdtempSync(join(tmpdir(), 'detune-caddy-'));
	const origin = `https://${HOST}:4444`;
	let app: BuiltServer | null = null;
	let caddy: ChildProcess | null = null;
	let browser: Browser | null = null;
	try {
		app = await startBuiltServer(4186, {
			dir: join(dir, 'app'),
			env: { ORIGIN: origin, ADDRESS_HEADER: 'X-Forwarded-For', XFF_DEPTH: '1' }
		});
		caddy = spawn('caddy', ['run', '--config', 'deploy/Caddyfile', '--adapter', 'caddyfile'], {
			env: {
				...process.env,
				DETUNE_HOST: HOST,
				DETUNE_HTTPS_PORT: '4444',
				DETUNE_HTTP_PORT: '4445',
				DETUNE_UPSTREAM: '127.0.0.1:4186',
				XDG_DATA_HOME: join(dir, 'data'),
				XDG_CONFIG_HOME: join(dir, 'config')
			},
			stdio: 'ignore'
		});
		const root = join(dir, 'data', 'caddy', 'pki', 'authorities', 'local', 'root.crt');
		await expect.poll(() => existsSync(root), { timeout: 20_000 }).toBe(true);
		browser = await tablet(homeTrusting(root));
		// Caddy issues the site certificate as it starts: wait until it answers
		const probe = await browser.newPage();
		await expect
			.poll(
				async () =>
					(await probe.goto(`${origin}/login`).then(
						(r) => r?.status(),
						() => 0
					)) ?? 0,
				{ timeout: 20_000 }
			)
			.toBe(200);
		await probe.close();
		await offlineShift(browser, origin, 'KRW-HLP-203');
	} finally {
		await browser?.close();
		caddy?.kill('SIGTERM');
		await app?.stop();
		rmSync(dir, { recursive: true, force: true });
	}
});

test('on plain HTTP under a host name the tablet says why offline cannot work, and a check still saves online', async () => {
	const origin = `http://${HOST}:4187`;
	const server = await startBuiltServer(4187, { env: { ORIGIN: origin } });
	const browser = await tablet();
	try {
		const context = await browser.newContext({ baseURL: origin, serviceWorkers: 'allow' });
		const page = await context.newPage();
		await page.goto('/login');
		await page.getByLabel('E-mail').fill('tech@example.com');
		await page.getByLabel('Password').fill('tech-demo-2026');
		await page.getByRole('button', { name: 'Sign in' }).click();
		await expect(page).toHaveURL(/\/field/);
		expect(await page.evaluate(() => window.isSecureContext)).toBe(false);
		await expect(page.getByTestId('insecure-banner')).toContainText('not secure');
		await expect(page.getByTestId('insecure-banner')).toContainText('On the plant network');
		// not an empty list: the assets came over the network
		await expect(page.getByTestId('asset-list').getByRole('button').first()).toBeVisible();
		await saveChecks(page, ['KRW-BWP-301']);
		await expect.poll(() => outboxCount(page), { timeout: 20_000 }).toBe(0);
		await context.close();
	} finally {
		await browser.close();
		await server.stop();
	}
});
