/**
 * A real installation, not the demo: `node build` on an empty database creates no account and
 * prints a one-time setup link; the database, files and backups are the owner's only; session ids
 * are not in the database; a restore is refused while the server runs, and ends every session.
 */
import { spawnSync } from 'node:child_process';
import { statSync } from 'node:fs';
import { join } from 'node:path';
import { expect, test } from './fixtures.ts';
import { cleanDir, postSignIn, startBuiltServer, withDatabase } from '../support/built-server.ts';

const PORT = 4188;
const DIR = '.e2e/first-run';
const mode = (f: string) => (statSync(f).mode & 0o777).toString(8);

test.afterAll(() => cleanDir(DIR));

test('first run without the demo: no accounts, a one-time setup link for the first admin, owner-only files, hashed sessions, no restore under a running server', async ({
	page
}) => {
	test.setTimeout(120_000);
	cleanDir(DIR);
	const server = await startBuiltServer(PORT, { dir: DIR, env: { SEED_DEMO: 'false' } });
	try {
		const line = await server.waitForLine(/\/setup\?token=[a-z0-9]+/);
		const link = /(https?:\/\/\S+\/setup\?token=[a-z0-9]+)/.exec(line)![1];
		// the demo's published admin password opens nothing
		const demo = await postSignIn(server.origin, 'admin@example.com', 'admin-demo-2026');
		expect(demo.status).toBe(400);
		expect(
			withDatabase(server.dbFile, (db) => db.prepare('select count(*) as n from users').get())
		).toEqual({ n: 0 });
		// a wrong token is refused
		expect((await fetch(`${server.origin}/setup?token=nope`)).status).toBe(404);

		await page.goto(link);
		await page.getByLabel('Name').fill('Plant Admin');
		await page.getByLabel('E-mail').fill('it@plant.example');
		await page.getByLabel('Password').fill('a long first password');
		await page.getByRole('button', { name: 'Create the first admin' }).click();
		await expect(page).toHaveURL(/\/login/);
		await page.getByLabel('E-mail').fill('it@plant.example');
		await page.getByLabel('Password').fill('a long first password');
		await page.getByRole('button', { name: 'Sign in' }).click();
		await expect(page.getByTestId('user-name')).toHaveText('Plant Admin');
		// the link is spent: an admin exists
		expect((await fetch(link)).status).toBe(404);

		// files are the owner's only; the database holds session hashes, not the cookie's id
		expect(mode(server.dbFile)).toBe('600');
		expect(mode(join(DIR, 'data'))).toBe('700');
		const cookie = (await page.context().cookies()).find((c) => c.name === 'detune_session')!;
		const stored = withDatabase(server.dbFile, (db) =>
			(db.prepare('select id from sessions').all() as { id: string }[]).map((r) => r.id)
		);
		expect(stored.length).toBeGreaterThan(0);
		expect(stored).not.toContain(cookie.value);

		// an online backup works; a restore while the server runs is refused
		const env = { ...process.env, DATABASE_URL: server.dbFile, DATA_DIR: join(DIR, 'data') };
		const backupDir = join(DIR, 'backup');
		const b = spawnSync('npx', ['tsx', 'src/lib/server/cli/backup.ts', backupDir], { env });
		expect(b.status, b.stderr.toString()).toBe(0);
		expect(mode(backupDir)).toBe('700');
		expect(mode(join(backupDir, 'detune.db'))).toBe('600');
		const r = spawnSync('npx', ['tsx', 'src/lib/server/cli/restore.ts', backupDir], { env });
		expect(r.status).toBe(1);
		expect(r.stderr.toString()).toMatch(/is running on .*Stop it first/);

		// with the server stopped it restores, and the restored database has no sessions
		await server.kill('SIGTERM');
		const ok = spawnSync('npx', ['tsx', 'src/lib/server/cli/restore.ts', backupDir], { env });
		expect(ok.status, ok.stderr.toString()).toBe(0);
		expect(
			withDatabase(server.dbFile, (db) => db.prepare('select count(*) as n from sessions').get())
		).toEqual({ n: 0 });
	} finally {
		await server.stop();
	}
});
