/**
 * `npm run bench`: every figure the issues ask for, as one table with the goals and ratios.
 * The loopback benchmarks run first, while this process's heap is small: the CPU benchmarks that
 * follow fill it, and a full heap's garbage collection would distort request timings.
 */
import { existsSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { engineBench } from './engine.bench.ts';
import { syncBench } from './sync.bench.ts';
import { recordingsBench } from './recordings.bench.ts';
import { scaleBench } from './scale.bench.ts';
import { loadBench } from './load.bench.ts';
import { floorBench } from './floor.bench.ts';
import { uploadBench } from './upload.bench.ts';
import { captureBench } from './capture.bench.ts';
import { sweepBench } from './sweep.bench.ts';
import { printTable, type Figure } from './harness.ts';

// `npm run bench -- board` runs only the named parts (floor, capture, sync, scale, load, upload, recordings, sweep, engine)
const only = process.argv.slice(2);
const wanted = (part: string) => only.length === 0 || only.includes(part);
const figures: Figure[] = [];
if (!existsSync('build/index.js')) {
	console.log('[bench] building the app …');
	const b = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], { stdio: 'inherit' });
	if (b.status !== 0) process.exit(1);
}
if (wanted('floor')) {
	console.log('[bench] Floor check in chromium with the CPU slowed 4× …');
	figures.push(...(await floorBench()));
}
if (wanted('capture')) {
	console.log('[bench] tap capture in chromium with the CPU slowed 4× …');
	figures.push(...(await captureBench()));
}
if (wanted('sync')) {
	console.log('[bench] sync over loopback …');
	figures.push(...(await syncBench()));
}
if (wanted('scale') || wanted('board')) {
	console.log('[bench] Margin board and push at 1,000, 10,000 and 100,000 assets …');
	figures.push(...(await scaleBench()));
	globalThis.gc?.();
}
if (wanted('load')) {
	console.log(
		'[bench] load: 50 connections pushing for 20 s, the board meanwhile, a sign-in burst …'
	);
	figures.push(...(await loadBench()));
	globalThis.gc?.();
}
if (wanted('upload')) {
	console.log('[bench] the server while it analyses a 49 MB WAV …');
	figures.push(...(await uploadBench()));
	globalThis.gc?.();
}
if (wanted('recordings')) {
	console.log('[bench] bump-test analysis and parsing …');
	figures.push(...(await recordingsBench()));
	globalThis.gc?.();
}
if (wanted('sweep')) {
	console.log('[bench] speed-sweep analysis …');
	figures.push(...sweepBench());
	globalThis.gc?.();
}
if (wanted('engine')) {
	console.log('[bench] engine …');
	figures.push(...engineBench());
}
console.log('');
printTable(figures);
