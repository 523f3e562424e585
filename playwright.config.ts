import { defineConfig } from '@playwright/test';
import { CHROMIUM, CHROMIUM_ARGS } from './tests/support/chromium.ts';

const PORT = 4173;
const ORIGIN = `http://127.0.0.1:${PORT}`;

/**
 * End-to-end tests against the built app (`vite build` first), in Debian's chromium. No browser is
 * ever downloaded: the executable is /usr/bin/chromium. The server starts on a fresh database
 * (migrated and seeded by its own start-up) in .e2e/.
 */
export default defineConfig({
	testDir: 'tests/e2e',
	testMatch: '**/*.e2e.ts',
	timeout: 60_000,
	expect: { timeout: 10_000 },
	fullyParallel: false,
	workers: 1,
	reporter: [['list']],
	webServer: {
		command: 'rm -rf .e2e && mkdir -p .e2e && node build',
		url: `${ORIGIN}/api/health`,
		env: {
			PORT: String(PORT),
			HOST: '127.0.0.1',
			DATABASE_URL: '.e2e/e2e.db',
			ORIGIN,
			DATA_DIR: '.e2e/data',
			SEED_DEMO: 'true',
			BODY_SIZE_LIMIT: '52M',
			SMTP_PORT: '2626'
		},
		reuseExistingServer: false,
		timeout: 60_000,
		stdout: 'pipe'
	},
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
