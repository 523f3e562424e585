/**
 * The app every end-to-end file talks to, at http://127.0.0.1:4173: the built server started
 * afresh for each test file on a copy of one seeded database (the demo data, nothing else), so
 * no file sees what another file left behind and the order of files does not matter. The tests
 * of one file share that file's server, as the steps of one user's day would.
 */
import { cpSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startBuiltServer, type BuiltServer } from '../support/built-server.ts';

export const PORT = 4173;
/** the seeded database and uploads every file starts from (written once, by global-setup.ts) */
export const TEMPLATE_DIR = '.e2e/template';

const ENV = {
	SEED_DEMO: 'true',
	BODY_SIZE_LIMIT: '52M',
	// the mail catcher and the reminder job run, as in a plain start of the app
	MAIL_CATCHER: 'true',
	MAIL_JOBS: 'true',
	SMTP_PORT: '2626'
};

/** Starts the app on the template's demo database (seeding it first when there is none yet). */
export async function startApp(from: string | null = TEMPLATE_DIR): Promise<BuiltServer> {
	const dir = mkdtempSync(join(tmpdir(), 'detune-e2e-'));
	if (from) cpSync(from, dir, { recursive: true });
	const server = await startBuiltServer(PORT, { dir, env: ENV });
	return {
		...server,
		async stop() {
			await server.stop();
			rmSync(dir, { recursive: true, force: true });
		}
	};
}
