/**
 * Recording analysis off the request path: uploads are parsed and analysed in a worker thread
 * (piscina), so a 50 MB file being analysed never holds up the board, a sign-in or a health check.
 * One thread (the event loop keeps the other core), at most a few uploads waiting, a time limit
 * per file and a heap limit per thread; a thread that dies is replaced by the pool.
 *
 * The worker is the bundle build/server/analysis-worker.js (svelte.config.js builds it after the
 * adapter). Where it does not exist — `vite dev`, vitest — the same task runs in-process.
 */
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Piscina } from 'piscina';
import { setting } from '../config.ts';
import { runAnalysis, type AnalysisOutcome, type AnalysisTask } from './task.ts';

export const WORKER_FILE_NAME = 'analysis-worker.js';
/** Uploads waiting beyond the one being analysed; more get "busy, retry". */
export const MAX_WAITING = 4;
/**
 * Seconds an upload may wait and be analysed; a 50 MB WAV takes about ten on one core. A reverse
 * proxy in front must allow as long (nginx's proxy_read_timeout is 60 s unless set).
 */
export const TIME_LIMIT_S = 120;

/** The analysis could not run now (queue full) or not at all (time or memory limit). */
export class AnalysisUnavailable extends Error {
	constructor(
		message: string,
		readonly retry: boolean
	) {
		super(message);
		this.name = 'AnalysisUnavailable';
	}
}

/** The built worker beside this chunk or one or two folders up, or the one the setting names. */
export function workerFile(): string | null {
	const named = setting('ANALYSIS_WORKER_FILE');
	if (named) return existsSync(named) ? named : null;
	let dir = dirname(fileURLToPath(import.meta.url));
	for (let up = 0; up < 3; up++, dir = dirname(dir)) {
		const candidate = join(dir, WORKER_FILE_NAME);
		if (existsSync(candidate)) return candidate;
	}
	return null;
}

let pool: Piscina<AnalysisTask, AnalysisOutcome> | null | undefined;

function thePool(): Piscina<AnalysisTask, AnalysisOutcome> | null {
	if (pool !== undefined) return pool;
	const file = workerFile();
	pool = file
		? new Piscina<AnalysisTask, AnalysisOutcome>({
				filename: file,
				minThreads: 0,
				maxThreads: 1,
				// a thread that has been idle a minute gives its memory back
				idleTimeout: 60_000,
				maxQueue: MAX_WAITING,
				// samples as float64 of a 50 MB 16-bit WAV are 200 MB; twice that is plenty
				resourceLimits: { maxOldGenerationSizeMb: 768 }
			})
		: null;
	return pool;
}

/** Where uploads are analysed: 'worker' (a thread) or 'inline' (this thread; dev and tests). */
export function analysisMode(): 'worker' | 'inline' {
	return thePool() ? 'worker' : 'inline';
}

/** Parses and analyses an upload's bytes; a refused file comes back as `{ ok: false }`. */
export async function analyseUpload(task: AnalysisTask): Promise<AnalysisOutcome> {
	const p = thePool();
	if (!p) return runAnalysis(task);
	// the worker gets its own copy, so the caller can still hash and store the bytes
	const copy = new Uint8Array(task.bytes.byteLength);
	copy.set(task.bytes);
	try {
		return await p.run(
			{ ...task, bytes: copy },
			{
				transferList: [copy.buffer as ArrayBuffer],
				signal: AbortSignal.timeout(TIME_LIMIT_S * 1000)
			}
		);
	} catch (e) {
		const message = e instanceof Error ? e.message : String(e);
		if (/queue is at limit/i.test(message))
			throw new AnalysisUnavailable(
				'The server is analysing other recordings; this one will be sent again shortly.',
				true
			);
		if (e instanceof Error && e.name === 'AbortError')
			throw new AnalysisUnavailable(
				`This recording took more than ${TIME_LIMIT_S} s to analyse and was stopped; shorten it or lower its sample rate.`,
				false
			);
		if (e instanceof Error && (e as { code?: string }).code === 'ERR_WORKER_OUT_OF_MEMORY')
			throw new AnalysisUnavailable(
				'This recording needs more memory to analyse than the server allows; shorten it or send fewer channels.',
				false
			);
		throw e;
	}
}

/** Stops the thread (tests, shutdown). */
export async function closeAnalysisPool(): Promise<void> {
	const p = pool;
	pool = undefined;
	if (p) await p.destroy();
}
