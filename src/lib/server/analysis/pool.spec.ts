/**
 * The analysis thread: the same answers as in-process, a refused file as a message, and the event
 * loop free while a large recording is analysed (before, ingest parsed and analysed on the
 * request's own thread, so nothing else was answered meanwhile).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build } from 'esbuild';
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { WaveFile } from 'wavefile';
import { analyseUpload, analysisMode, closeAnalysisPool } from './pool.ts';
import { runAnalysis } from './task.ts';

// inside the project, so the bundle's imports (papaparse, fft.js) resolve from node_modules
mkdirSync('node_modules/.cache', { recursive: true });
const dir = mkdtempSync(join('node_modules/.cache', 'detune-worker-'));

/**
 * One hit a tenth of a second in, ringing in two modes (23 Hz ζ 0.02, 71 Hz ζ 0.015) over a noise
 * floor, as a 16-bit WAV of n samples.
 */
function ringdownWav(n: number, fs = 8192): Uint8Array {
	const x = new Array<number>(n);
	let seed = 7;
	for (let i = 0; i < n; i++) {
		const t = i / fs - 0.1;
		seed = (seed * 16807) % 2147483647;
		const noise = 30 * (seed / 2147483647 - 0.5);
		const ring =
			t < 0
				? 0
				: Math.exp(-0.02 * 2 * Math.PI * 23 * t) * Math.sin(2 * Math.PI * 23 * t) * 0.6 +
					Math.exp(-0.015 * 2 * Math.PI * 71 * t) * Math.sin(2 * Math.PI * 71 * t) * 0.3;
		x[i] = Math.round(20000 * ring + noise);
	}
	const w = new WaveFile();
	w.fromScratch(1, fs, '16', x);
	return w.toBuffer();
}

beforeAll(async () => {
	// the worker bundled as the production build bundles it (svelte.config.js)
	const file = join(process.cwd(), dir, 'analysis-worker.js');
	await build({
		entryPoints: ['src/lib/server/analysis/worker.ts'],
		outfile: file,
		bundle: true,
		platform: 'node',
		format: 'esm',
		packages: 'external',
		logLevel: 'warning'
	});
	process.env.ANALYSIS_WORKER_FILE = file;
	await closeAnalysisPool();
});

afterAll(async () => {
	await closeAnalysisPool();
	delete process.env.ANALYSIS_WORKER_FILE;
	rmSync(dir, { recursive: true, force: true });
});

describe('analysis in a worker thread', () => {
	it('runs in the thread and finds what the in-process analysis finds', async () => {
		expect(analysisMode()).toBe('worker');
		const bytes = ringdownWav(8192 * 4);
		const task = { bytes, fileName: 'hit.wav', mediaType: 'audio/wav', sampleRateHz: null };
		const there = await analyseUpload(task);
		const here = runAnalysis(task);
		expect(there).toEqual(here);
		expect(there.ok && there.analysis.modes.map((m) => Math.round(m.frequencyHz))).toEqual(
			expect.arrayContaining([23, 71])
		);
		// the caller's bytes are untouched (the thread got a copy), so they can still be stored
		expect(bytes.byteLength).toBeGreaterThan(0);
	});

	it('answers a file it cannot read with the reader’s message and place', async () => {
		const bytes = new TextEncoder().encode('time,a\n0,1\n0.001,x\n');
		const r = await analyseUpload({
			bytes,
			fileName: 'bad.csv',
			mediaType: 'text/csv',
			sampleRateHz: null
		});
		expect(r).toEqual({
			ok: false,
			message: expect.stringMatching(/Row 3, column 2/),
			row: 3,
			column: 2
		});
	});

	it('leaves the event loop free while a long recording is analysed', async () => {
		const bytes = ringdownWav(8192 * 60); // a minute at 8 kHz, 1 MB
		let ticks = 0;
		const timer = setInterval(() => ticks++, 1);
		try {
			const r = await analyseUpload({
				bytes,
				fileName: 'long.wav',
				mediaType: 'audio/wav',
				sampleRateHz: null
			});
			expect(r.ok).toBe(true);
		} finally {
			clearInterval(timer);
		}
		// in-process, the analysis is one synchronous run and no timer fires until it ends
		expect(ticks).toBeGreaterThan(5);
	}, 30_000);
});
