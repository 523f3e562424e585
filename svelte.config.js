import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

const OUT = 'build';
const node = adapter({ out: OUT, precompress: false });

/**
 * adapter-node, then the server's analysis worker thread bundled on its own beside the server
 * (build/server/analysis-worker.js): a worker thread needs a file of its own, which the adapter's
 * bundle of the routes does not make. See src/lib/server/analysis/pool.ts.
 * @type {import('@sveltejs/kit').Adapter}
 */
const withAnalysisWorker = {
	...node,
	name: `${node.name} + analysis worker`,
	async adapt(builder) {
		await node.adapt(builder);
		const { build } = await import('esbuild');
		await build({
			entryPoints: ['src/lib/server/analysis/worker.ts'],
			outfile: `${OUT}/server/analysis-worker.js`,
			bundle: true,
			platform: 'node',
			format: 'esm',
			target: 'node20',
			// papaparse and fft.js are dependencies: node resolves them as it does for the server
			packages: 'external',
			logLevel: 'warning'
		});
		builder.log.minor('Built the analysis worker');
	}
};

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// no precompressed copies: a reverse proxy compresses, and a deploy can swap sw.js in place
		adapter: withAnalysisWorker,
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
