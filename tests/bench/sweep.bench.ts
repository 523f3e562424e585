/**
 * Speed-sweep analysis speed: a 60 s run-up at 25.6 kHz, a tachometer and a vibration channel
 * (1.536 million samples each), through the whole analysis the tablet's worker runs (edges,
 * repair, three orders tracked over every turn, resonances, the waterfall), against the FFTs that
 * analysis needs (the waterfall's, timed alone with the same fft.js transforms).
 */
import { magnitudeSpectrum } from '../../src/lib/vibration/signal/spectrum.ts';
import { analyzeSweepRecording, defaultSweepChoice } from '../../src/lib/recordings/sweep.ts';
import type { Recording } from '../../src/lib/recordings/types.ts';
import { ramp, shaft, tachChannel, type SweepSpec } from '../support/sweep-signal.ts';
import { median, time, type Figure } from './harness.ts';

/**
 * The vibration of two modes (32 Hz ζ 0.03, 51 Hz ζ 0.05) under unbalance, at each instant the
 * steady response to the speed of that instant (the sweep is slow), with noise: for timing only.
 */
function record(): Recording {
	const spec: SweepSpec = { fs: 25_600, speed: ramp(900, 3600, 60), modes: [] };
	const tach = tachChannel(spec);
	const x = new Float64Array(tach.length);
	const modes = [
		{ f: 32, zeta: 0.03, u: 8 },
		{ f: 51, zeta: 0.05, u: 5 }
	];
	let s = 7;
	for (let i = 0; i < x.length; i++) {
		const { theta, omega } = shaft(spec, i / spec.fs);
		let v = 0;
		for (const m of modes) {
			const r = omega / (2 * Math.PI * m.f);
			const lag = Math.atan2(2 * m.zeta * r, 1 - r * r);
			v += ((m.u * r * r) / Math.hypot(1 - r * r, 2 * m.zeta * r)) * Math.cos(theta - lag);
		}
		s = (s * 16807) % 2147483647;
		x[i] = v + 0.5 * (s / 2147483647 - 0.5);
	}
	return {
		format: 'csv',
		fileName: 'bench-runup.csv',
		sizeBytes: 0,
		sampleRateHz: spec.fs,
		durationS: 60,
		channels: [
			{ name: 'Tach', unit: 'V', samples: tach },
			{ name: 'Bearing displacement', unit: 'µm', samples: x }
		]
	};
}

export function sweepBench(): Figure[] {
	const rec = record();
	const choice = defaultSweepChoice(rec, [13], 3600);
	let found = 0;
	let ffts = 0;
	let nfft = 0;
	let revolutions = 0;
	const analysis = median(
		time(
			() => {
				const a = analyzeSweepRecording(rec, choice);
				found = a.result.pieces.reduce((n, p) => n + p.resonances.length, 0);
				ffts = a.result.waterfall.ffts;
				nfft = a.result.waterfall.nfft;
				revolutions = a.tach.revolutions;
			},
			7,
			2
		)
	);
	const x = rec.channels[1].samples;
	const seg = x.subarray(0, nfft);
	const transforms = median(
		time(
			() => {
				for (let k = 0; k < ffts; k++) magnitudeSpectrum(seg, nfft);
			},
			7,
			2
		)
	);
	return [
		{
			name: 'speed sweep: 60 s run-up, 2 channels at 25.6 kHz',
			value: analysis,
			unit: 'ms (median of 7)',
			goal: 1000,
			goalKind: 'max',
			note: `${revolutions} revolutions, orders ${choice.orders.join(', ')}, ${found} resonances; parsing the file not included`
		},
		{
			name: 'speed sweep ÷ the FFTs it needs',
			value: analysis / transforms,
			unit: '×',
			note: `the waterfall's ${ffts} transforms of ${nfft} take ${transforms.toFixed(1)} ms; order tracking is a DFT per turn, no FFT`
		}
	];
}
