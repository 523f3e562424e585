/** `npm run bench`: every figure the issues ask for, as one table with the goals and ratios. */
import { existsSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { engineBench } from './engine.bench.ts';
import { syncBench } from './sync.bench.ts';
import { recordingsBench } from './recordings.bench.ts';
import { printTable, type Figure } from './harness.ts';

const figures: Figure[] = [];
console.log('[bench] engine …');
figures.push(...engineBench());
console.log('[bench] bump-test analysis and parsing …');
figures.push(...recordingsBench());
if (!existsSync('build/index.js')) {
	console.log('[bench] building the app …');
	const b = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], { stdio: 'inherit' });
	if (b.status !== 0) process.exit(1);
}
console.log('[bench] sync over loopback …');
figures.push(...(await syncBench()));
console.log('');
printTable(figures);
