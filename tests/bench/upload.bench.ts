/**
 * The server while it analyses a 49 MB WAV: /api/health polled every 10 ms from the moment the
 * upload starts until its answer, once with the analysis in its worker thread and once in-process
 * (ANALYSIS_WORKER_FILE pointing nowhere), so the figure and what it replaced are side by side.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { percentile, type Figure } from './harness.ts';
import { signInCookie, startServer } from './server.ts';

/** A 16-bit stereo WAV of `seconds` at `fs`: five hits ringing two modes, a running tone, noise. */
function bigWav(seconds: number, fs: number): Buffer {
	const frames = Math.round(seconds * fs);
	const data = Buffer.alloc(44 + frames * 4);
	data.write('RIFF', 0, 'ascii');
	data.writeUInt32LE(36 + frames * 4, 4);
	data.write('WAVEfmt ', 8, 'ascii');
	data.writeUInt32LE(16, 16);
	data.writeUInt16LE(1, 20); // PCM
	data.writeUInt16LE(2, 22);
	data.writeUInt32LE(fs, 24);
	data.writeUInt32LE(fs * 4, 28);
	data.writeUInt16LE(4, 32);
	data.writeUInt16LE(16, 34);
	data.write('data', 36, 'ascii');
	data.writeUInt32LE(frames * 4, 40);
	const spacing = seconds / 5;
	let seed = 1;
	for (let i = 0; i < frames; i++) {
		const t = (i / fs) % spacing;
		seed = (seed * 16807) % 2147483647;
		const ring =
			Math.exp(-0.02 * 2 * Math.PI * 31 * t) * Math.sin(2 * Math.PI * 31 * t) +
			0.5 * Math.exp(-0.01 * 2 * Math.PI * 187 * t) * Math.sin(2 * Math.PI * 187 * t);
		const v =
			12000 * ring +
			3000 * Math.sin((2 * Math.PI * 24.8 * i) / fs) +
			60 * (seed / 2147483647 - 0.5);
		data.writeInt16LE(Math.round(v), 44 + i * 4);
		data.writeInt16LE(Math.round(0.5 * v), 46 + i * 4);
	}
	return data;
}

/** A process's resident memory and its peak since the last reset, MB (Linux /proc). */
function memory(pid: number): { rss: number; peak: number } {
	const status = readFileSync(`/proc/${pid}/status`, 'utf8');
	const kb = (key: string) => Number(new RegExp(`${key}:\\s+(\\d+) kB`).exec(status)?.[1] ?? NaN);
	return { rss: kb('VmRSS') / 1024, peak: kb('VmHWM') / 1024 };
}

/**
 * A CSV whose header has a million columns: the answer's status and time, and how far the
 * server's resident memory rose above where it stood (its peak reset first, through clear_refs).
 */
async function millionColumns(origin: string, pid: number, cookie: string, assetId: string) {
	const csv = Buffer.from(
		Array.from({ length: 1_000_000 }, (_, i) => `c${i}`).join(',') +
			'\n' +
			'1,'.repeat(999_999) +
			'1\n'
	);
	try {
		writeFileSync(`/proc/${pid}/clear_refs`, '5');
	} catch {
		/* not root, or not Linux: the peak then counts from the server's start */
	}
	const before = memory(pid);
	const q = new URLSearchParams({ id: crypto.randomUUID(), assetId, name: 'wide.csv' });
	const t0 = performance.now();
	const res = await fetch(`${origin}/api/recordings?${q}`, {
		method: 'POST',
		headers: { 'content-type': 'text/csv', cookie, origin },
		body: new Blob([csv])
	});
	const body = (await res.json()) as { message?: string };
	const ms = performance.now() - t0;
	const after = memory(pid);
	return {
		status: res.status,
		message: body.message ?? '',
		ms,
		growthMb: after.peak - before.rss,
		mb: csv.length / 1048576
	};
}

async function healthDuringUpload(
	port: number,
	wav: Buffer,
	env: Record<string, string>,
	wide = false
) {
	const server = await startServer(port, { BODY_SIZE_LIMIT: '52M', ...env });
	try {
		const cookie = await signInCookie(server.origin, 'tech@example.com', 'tech-demo-2026');
		const pull = await (
			await fetch(`${server.origin}/api/sync/pull?since=0`, { headers: { cookie } })
		).json();
		const assetId = (pull.assets as { id: string }[])[0].id;
		const columns = wide ? await millionColumns(server.origin, server.pid, cookie, assetId) : null;
		const q = new URLSearchParams({ id: crypto.randomUUID(), assetId, name: 'run-of-hits.wav' });
		let done = false;
		const t0 = performance.now();
		const upload = fetch(`${server.origin}/api/recordings?${q}`, {
			method: 'POST',
			headers: { 'content-type': 'audio/wav', cookie, origin: server.origin },
			body: new Uint8Array(wav)
		}).then(async (r) => {
			done = true;
			return { status: r.status, body: await r.json(), seconds: (performance.now() - t0) / 1000 };
		});
		const latencies: number[] = [];
		let failed = 0;
		// a poll every 10 ms or so, as a monitor would but a hundred times as often
		while (!done) {
			const s = performance.now();
			// a blocked server lets its keep-alive sockets expire and resets the next request on one:
			// that poll failed, and its time counts
			try {
				const r = await fetch(`${server.origin}/api/health`);
				await r.arrayBuffer();
				if (!r.ok) failed++;
			} catch {
				failed++;
			}
			latencies.push(performance.now() - s);
			await new Promise((resolve) => setTimeout(resolve, 10));
		}
		const result = await upload;
		if (result.status !== 201)
			throw new Error(`upload answered ${result.status}: ${JSON.stringify(result.body)}`);
		return { latencies, failed, columns, ...result };
	} finally {
		await server.stop();
	}
}

export async function uploadBench(): Promise<Figure[]> {
	const wav = bigWav(250, 51_200); // 48.8 MiB, just under the 50 MiB limit
	const mb = wav.length / 1048576;
	const worker = await healthDuringUpload(4331, wav, {}, true);
	const wide = worker.columns!;
	if (wide.status < 400 || wide.status >= 500)
		throw new Error(`the million-column CSV answered ${wide.status}: ${wide.message}`);
	const inline = await healthDuringUpload(4332, wav, {
		ANALYSIS_WORKER_FILE: '/nonexistent/analysis-worker.js'
	});
	const p99 = percentile(worker.latencies, 99);
	const p99Inline = percentile(inline.latencies, 99);
	return [
		{
			name: `health p99 while a ${mb.toFixed(0)} MB WAV is analysed`,
			value: p99,
			unit: 'ms',
			goal: 200,
			goalKind: 'max',
			note: `${worker.latencies.length} polls (${worker.failed} failed), max ${Math.max(...worker.latencies).toFixed(0)} ms; upload answered in ${worker.seconds.toFixed(1)} s with ${worker.body.modes} modes`
		},
		{
			name: 'a 1,000,000-column CSV: time to its 4xx',
			value: wide.ms,
			unit: 'ms',
			goal: 1000,
			goalKind: 'max',
			note: `${wide.mb.toFixed(1)} MB, answered ${wide.status}: “${wide.message.slice(0, 60)}…”`
		},
		{
			name: '… and the server’s memory above where it stood',
			value: wide.growthMb,
			unit: 'MB',
			goal: 100,
			goalKind: 'max',
			note: 'peak resident (VmHWM, reset before) less resident before; worker thread included'
		},
		{
			name: '… the same with the analysis in-process (before)',
			value: p99Inline,
			unit: 'ms',
			note: `${inline.latencies.length} polls (${inline.failed} failed), max ${Math.max(...inline.latencies).toFixed(0)} ms; ${(p99Inline / p99).toFixed(0)}× the worker's p99; upload ${inline.seconds.toFixed(1)} s`
		}
	];
}
