// Bundles the benchmark with esbuild into .bench/ and runs it with plain node, so the figures
// measure the code as the production build runs it (tsx's keep-names wrapping would distort them).
import { build } from 'esbuild';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../..', import.meta.url));
await build({
	entryPoints: [`${root}tests/bench/run.ts`],
	outfile: `${root}.bench/run.mjs`,
	bundle: true,
	platform: 'node',
	format: 'esm',
	target: 'node20',
	packages: 'external',
	sourcemap: false,
	alias: { '$env/dynamic/private': `${root}tests/bench/env-shim.ts` },
	logLevel: 'warning'
});
const r = spawnSync(
	process.execPath,
	['--expose-gc', `${root}.bench/run.mjs`, ...process.argv.slice(2)],
	// the bench's own process never touches data/: its app modules get an empty in-memory database
	{ stdio: 'inherit', cwd: root, env: { ...process.env, DATABASE_URL: ':memory:' } }
);
process.exit(r.status ?? 1);
