import { defineConfig } from '@playwright/test';
import { CHROMIUM, CHROMIUM_ARGS } from './tests/support/chromium.ts';

const PORT = 4173;
const ORIGIN = `http://127.0.0.1:${PORT}`;

/**
 * End-to-end tests against the built app (`vite build` first), in Debian's chromium. No browser is
 * ever downloaded: the executable is /usr/bin/chromium. Each test file gets the app on its own
 * copy of the demo database, so files do not depend on one another or on their order.
 */
export default defineConfig({
	testDir: 'tests/e2e',
	testMatch: '**/*.e2e.ts',
	timeout: 60_000,
	expect: { timeout: 10_000 },
	fullyParallel: false,
	workers: 1,
	reporter: [['list']],
	// the app is started for each test file on a fresh copy of the seeded demo database
	// (tests/e2e/fixtures.ts); global setup seeds that database once
	globalSetup: './tests/e2e/global-setup.ts',
	use: {
		baseURL: ORIGIN,
		browserName: 'chromium',
		headless: true,
		serviceWorkers: 'allow',
		launchOptions: {
			executablePath: CHROMIUM,
			args: CHROMIUM_ARGS
		}
	}
});
