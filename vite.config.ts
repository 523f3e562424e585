import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	test: {
		include: ['src/**/*.spec.ts', 'tests/unit/**/*.spec.ts'],
		environment: 'node',
		// each test file gets its own in-memory database through $lib/server/db
		env: { DATABASE_URL: ':memory:', SEED_DEMO: 'false' },
		expect: { requireAssertions: true },
		coverage: {
			provider: 'v8',
			include: ['src/lib/vibration/**/*.ts'],
			exclude: ['**/*.spec.ts'],
			reporter: ['text-summary', 'text'],
			// the engine carries every verdict: keep it covered
			thresholds: { lines: 95 }
		}
	}
});
