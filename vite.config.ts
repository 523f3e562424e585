import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { SvelteKitPWA } from '@vite-pwa/sveltekit';
import { defineConfig } from 'vitest/config';
import { svelteTesting } from '@testing-library/svelte/vite';

/** A revision for the pages the service worker keeps (they change with every build). */
const BUILD = Date.now().toString(36);
const OFFLINE_PAGES = ['/field', '/login', '/offline'];

export default defineConfig({
	plugins: [
		tailwindcss(),
		sveltekit(),
		SvelteKitPWA({
			// a new version waits for the technician's yes: it never reloads the page under them
			registerType: 'prompt',
			injectRegister: false,
			// one worker for the whole app, registered from whichever page opens first
			base: '/',
			scope: '/',
			manifest: {
				id: '/field',
				name: 'Detune — resonance checks',
				short_name: 'Detune',
				description:
					'Separation margins between natural frequencies and forcing frequencies, on the plant floor.',
				start_url: '/field',
				scope: '/',
				display: 'standalone',
				orientation: 'any',
				theme_color: '#0b6e69',
				background_color: '#f4f5f1',
				icons: [
					{ src: '/icons/detune-192.png', sizes: '192x192', type: 'image/png' },
					{ src: '/icons/detune-512.png', sizes: '512x512', type: 'image/png' },
					{
						src: '/icons/detune-maskable-512.png',
						sizes: '512x512',
						type: 'image/png',
						purpose: 'maskable'
					}
				]
			},
			workbox: {
				clientsClaim: true,
				skipWaiting: false,
				cleanupOutdatedCaches: true,
				// the app shell, fonts and everything Floor check needs (the analysis worker included)
				globPatterns: ['client/**/*.{js,css,ico,png,svg,webp,woff2,webmanifest}'],
				// pages the worker fetches when it installs, so they open offline from the first visit:
				// Floor check (a shell that renders from IndexedDB), sign-in and the offline page. None of
				// them depends on the session; each build gives them a new revision
				additionalManifestEntries: OFFLINE_PAGES.map((url) => ({ url, revision: BUILD })),
				// /login?next=/field and /field?… are the same cached page
				ignoreURLParametersMatching: [/.*/],
				navigateFallback: null,
				runtimeCaching: [
					{
						// every other page comes from the network; without one, the page that says what
						// works offline
						urlPattern: ({ request }) => request.mode === 'navigate',
						handler: 'NetworkOnly',
						options: { precacheFallback: { fallbackURL: '/offline' } }
					}
				]
			}
		})
	],
	test: {
		// each test file gets its own in-memory database through $lib/server/db
		env: { DATABASE_URL: ':memory:', SEED_DEMO: 'false', SMTP_PORT: '2727' },
		expect: { requireAssertions: true },
		// a guard against a hang, not a speed check (speed is benchmarked): the reference signals
		// integrated by ODEX take seconds each under coverage on a loaded CI machine, past the
		// default 5 s (the two-mode rotor of sweep.spec.ts took 2.3 s here and over 5 s in CI)
		testTimeout: 30_000,
		projects: [
			{
				extends: true,
				test: {
					name: 'node',
					include: ['src/**/*.spec.ts', 'tests/unit/**/*.spec.ts'],
					exclude: ['src/**/*.component.spec.ts'],
					environment: 'node'
				}
			},
			{
				// Svelte components rendered into happy-dom with @testing-library/svelte
				extends: true,
				plugins: [svelteTesting()],
				test: {
					name: 'components',
					include: ['src/**/*.component.spec.ts'],
					environment: 'happy-dom'
				}
			}
		],
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
