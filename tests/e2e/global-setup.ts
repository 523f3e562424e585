import { cpSync, mkdirSync, rmSync } from 'node:fs';
import { startApp, TEMPLATE_DIR } from './app-server.ts';

/** Seeds the demo database once (migrations and demo data, as the app's own start-up does). */
export default async function globalSetup() {
	rmSync('.e2e', { recursive: true, force: true });
	const server = await startApp(null);
	await server.kill('SIGTERM');
	mkdirSync(TEMPLATE_DIR, { recursive: true });
	cpSync(server.dir, TEMPLATE_DIR, { recursive: true });
	await server.stop();
}
