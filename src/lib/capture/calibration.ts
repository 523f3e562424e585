/**
 * Reading a calibrator's tone: the r.m.s. level of the input in a band around the reference
 * frequency (±5 %), so that the room's noise and the machine next door do not count, and the tone's
 * own frequency (a calibrator is seldom exactly on 159.2 Hz). A Hann window and Parseval's theorem
 * over the band's bins: exact for a tone anywhere in the band, whatever the bin spacing.
 */
import { hannWindow, windowedAmplitude } from '../vibration/signal/spectrum.ts';

export interface ToneReading {
	/** r.m.s. in the band, in the samples' unit (full scale) */
	rms: number;
	/** the strongest bin in the band, refined by a parabola through its neighbours (Hz) */
	frequencyHz: number;
	/** the band's share of the whole signal's power: near 1 for a clean calibrator tone */
	purity: number;
}

export function readTone(
	samples: ArrayLike<number>,
	sampleRateHz: number,
	referenceHz: number,
	relativeBand = 0.05
): ToneReading {
	// the largest power of two the samples fill (at least 4096: a tenth of a second at 44.1 kHz)
	let n = 4096;
	while (n * 2 <= samples.length) n *= 2;
	if (samples.length < n)
		throw new RangeError('Record the calibrator for at least a tenth of a second.');
	const start = samples.length - n;
	let mean = 0;
	for (let i = 0; i < n; i++) mean += samples[start + i] / n;
	const x = new Float64Array(n);
	let total = 0;
	for (let i = 0; i < n; i++) {
		x[i] = samples[start + i] - mean;
		total += x[i] * x[i];
	}
	const w = hannWindow(n);
	let wsum = 0;
	let w2 = 0;
	for (const v of w) {
		wsum += v;
		w2 += v * v;
	}
	// |X_k| back from the amplitude spectrum (2|X_k|/Σw)
	const amplitude = windowedAmplitude(x, 0, w, n);
	const df = sampleRateHz / n;
	const lo = Math.max(1, Math.floor((referenceHz * (1 - relativeBand)) / df));
	const hi = Math.min(n / 2 - 1, Math.ceil((referenceHz * (1 + relativeBand)) / df));
	let power = 0;
	let best = lo;
	const p = (k: number) => (amplitude[k] * wsum * 0.5) ** 2;
	for (let k = lo; k <= hi; k++) {
		power += p(k);
		if (p(k) > p(best)) best = k;
	}
	// one-sided spectrum: a real signal's power sits in k and n−k; the window's power gain is Σw²
	const rms = Math.sqrt((2 * power) / (n * w2));
	const a = Math.sqrt(p(best - 1));
	const b = Math.sqrt(p(best));
	const c = Math.sqrt(p(best + 1));
	const shift = a - 2 * b + c === 0 ? 0 : (0.5 * (a - c)) / (a - 2 * b + c);
	return {
		rms,
		frequencyHz: (best + shift) * df,
		purity: total > 0 ? Math.min(1, (rms * rms) / (total / n)) : 0
	};
}
