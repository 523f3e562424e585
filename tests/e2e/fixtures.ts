/**
 * `test` for the end-to-end files: Playwright's, with the app restarted on the demo database
 * whenever a new file begins (app-server.ts). Import `test` and `expect` from here.
 */
import { test as base, expect } from '@playwright/test';
import type { BuiltServer } from '../support/built-server.ts';
import { startApp } from './app-server.ts';

interface Running {
	file: string | null;
	server: BuiltServer | null;
}

export const test = base.extend<{ appForFile: void }, { app: Running }>({
	// one per worker process; stopped when the worker ends
	app: [
		// eslint-disable-next-line no-empty-pattern -- Playwright reads a fixture's needs from this pattern
		async ({}, use) => {
			const running: Running = { file: null, server: null };
			await use(running);
			await running.server?.stop();
		},
		{ scope: 'worker' }
	],
	appForFile: [
		async ({ app }, use, testInfo) => {
			if (app.file !== testInfo.file) {
				await app.server?.stop();
				app.server = null;
				app.server = await startApp();
				app.file = testInfo.file;
			}
			await use();
		},
		{ auto: true }
	]
});

export { expect };
