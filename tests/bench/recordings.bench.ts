/**
 * Bump-test analysis speed (65,536 samples against one raw fft.js transform of the same length)
 * and the peak memory of parsing a 50 MB CSV recording.
 */
import FFT from 'fft.js';
import { analyzeRingdown } from '../../src/lib/vibration/index.ts';
import { parseCsvBlob, parseCsvText } from '../../src/lib/recordings/csv.ts';
import { median, time, type Figure } from './harness.ts';

function signal(n: number, fs: number): Float64Array {
	const x = new Float64Array(n);
	const modes = [
		{ f: 23, z: 0.02, a: 1 },
		{ f: 71, z: 0.015, a: 0.5 },
		{ f: 180, z: 0.03, a: 0.3 }
	];
	let s = 1;
	for (let i = 0; i < n; i++) {
		const t = i / fs;
		let v = 0;
		for (const m of modes)
			v += m.a * Math.exp(-m.z * 2 * Math.PI * m.f * t) * Math.sin(2 * Math.PI * m.f * t);
		s = (s * 16807) % 2147483647;
		x[i] = v + 0.01 * (s / 2147483647 - 0.5);
	}
	return x;
}

/** Peak memory (heap and external, which holds the array buffers) above where it stood. */
async function peakGrowth<T>(run: (sample: () => void) => Promise<T> | T) {
	globalThis.gc?.();
	const used = () => {
		const m = process.memoryUsage();
		return m.heapUsed + m.external;
	};
	const before = used();
	let peak = before;
	const t0 = performance.now();
	const result = await run(() => {
		peak = Math.max(peak, used());
	});
	return { result, mb: (peak - before) / 1048576, seconds: (performance.now() - t0) / 1000 };
}

export async function recordingsBench(): Promise<Figure[]> {
	const n = 65_536;
	const x = signal(n, 8192);
	const fft = new FFT(n);
	const out = fft.createComplexArray();
	const raw = median(time(() => fft.realTransform(out, x), 21, 5));
	let modes = 0;
	const analysis = median(
		time(
			() => {
				modes = analyzeRingdown(x, 8192).modes.length;
			},
			// enough runs that one collection of the heap does not move the median
			41,
			5
		)
	);

	// a 50 MB CSV: time and two channels
	const rows: string[] = ['time,accel,force', 's,g,N'];
	let bytes = 0;
	const fs = 10_240;
	for (let i = 0; bytes < 50 * 1024 * 1024 - 64; i++) {
		const line = `${(i / fs).toFixed(7)},${(Math.sin(i / 7) * 0.5).toFixed(7)},${(Math.cos(i / 11) * 3).toFixed(6)}`;
		rows.push(line);
		bytes += line.length + 1;
	}
	const text = rows.join('\n');
	rows.length = 0;
	// the server's path: the upload's text in chunks
	const server = await peakGrowth((sample) => parseCsvText(text, 'big.csv', null, sample));
	// the tablet's: a File streamed and decoded in chunks (a Blob here, as the worker gets it)
	const blob = new Blob([text]);
	const tablet = await peakGrowth((sample) => parseCsvBlob(blob, null, sample));
	const rec = tablet.result;
	return [
		{
			name: 'analysis: 65,536-sample ring-down',
			value: analysis,
			unit: 'ms (median of 41)',
			goal: 50,
			goalKind: 'max',
			note: `${modes} modes found; at this length no zero padding (×2 below 65,536); damping two ways`
		},
		{
			name: 'analysis ÷ one raw fft.js transform (65,536)',
			value: analysis / raw,
			unit: '×',
			goal: 10,
			goalKind: 'max',
			note: `raw transform ${raw.toFixed(2)} ms`
		},
		{
			name: 'tablet: parse a 50 MB CSV, peak memory above the file',
			value: tablet.mb,
			unit: 'MB',
			goal: 100,
			goalKind: 'max',
			note: `${rec.channels[0].samples.length.toLocaleString('en')} rows × ${rec.channels.length} channels in ${tablet.seconds.toFixed(1)} s; the channels alone ${((rec.channels.length * rec.channels[0].samples.length * 8) / 1048576).toFixed(0)} MB`
		},
		{
			name: 'server: parse the same text, peak memory above it',
			value: server.mb,
			unit: 'MB',
			goal: 100,
			goalKind: 'max',
			note: `${server.seconds.toFixed(1)} s; the text itself ${(text.length / 1048576).toFixed(0)} MB`
		}
	];
}
