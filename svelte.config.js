import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// no precompressed copies: a reverse proxy compresses, and a deploy can swap sw.js in place
		adapter: adapter({ out: 'build', precompress: false }),
		// the PWA plugin generates the service worker; SvelteKit's own one is off
		serviceWorker: { register: false },
		typescript: {
			// odex ships its TypeScript source beside the JS; point the checker at our declaration
			config: (tsconfig) => {
				tsconfig.compilerOptions.paths = {
					...tsconfig.compilerOptions.paths,
					odex: ['../src/types/odex.d.ts']
				};
				return tsconfig;
			}
		},
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:'],
				'font-src': ['self'],
				'connect-src': ['self'],
				'worker-src': ['self', 'blob:'],
				'manifest-src': ['self'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'form-action': ['self'],
				'frame-ancestors': ['none']
			}
		}
	}
};

export default config;
