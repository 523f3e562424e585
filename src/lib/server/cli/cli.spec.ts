import { afterAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const dir = mkdtempSync(join(tmpdir(), 'detune-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const npm = (script: string, ...args: string[]) =>
	execFileSync('npm', ['run', '--silent', script, ...(args.length ? ['--', ...args] : [])], {
		env: { ...process.env, DATABASE_URL: join(dir, 'cli.db') },
		encoding: 'utf8',
		timeout: 60_000
	});

// the commands the README names run outside the server, where SvelteKit's $env does not exist
describe('the command-line tools the README names', () => {
	it('db:migrate, seed (twice: idempotent) and backup run on a new database', () => {
		expect(npm('db:migrate')).toContain('migrations applied to');
		expect(npm('seed')).toMatch(/added 2 sites, 5 users, 40 assets, \d+ excitation sources/);
		expect(npm('seed')).toMatch(/added 0 sites, 0 users, 0 assets/);
		expect(npm('backup', join(dir, 'backup'))).toContain('integrity ok');
	}, 120_000);
});
