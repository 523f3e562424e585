/**
 * Bump-test (ring-down) analysis of a response-only recording: the modes it holds, each with its
 * frequency and its damping estimated two ways.
 *
 * Method (../shared/domain.md §6.1; Trethewey & Cafeo 1992; Ewins, Modal Testing §4):
 * 1. remove mean and linear trend; find the hit; flag clipping and a second hit;
 * 2. optionally apply an exponential window e^(−t/τ_w) (its added damping Δζ = 1/(ω_n·τ_w) is
 *    subtracted again);
 * 3. zero-padded FFT (fft.js); peaks ranked by prominence, frequency by Gaussian interpolation;
 * 4. damping from the half-power bandwidth ζ = (f₂ − f₁)/(2f) (F5), and from the decay of the
 *    mode's envelope: complex demodulation at the mode frequency, a triangular low-pass, and a
 *    straight-line fit to ln(envelope) (the log decrement per unit time, F4);
 * 5. quality flags: resolution too coarse for the bandwidth (fewer than 5 resolution steps across
 *    it), record shorter than six time constants, clipping, double hit, the two estimates
 *    disagreeing. A peak whose envelope does not decay is a steady tone (line frequency, a running
 *    machine nearby), reported apart, not as a mode.
 */
import { finite, integerAtLeast, positive, VibrationInputError } from '../errors.ts';
import { bucketMax, magnitude, nextPow2, realFft } from './spectrum.ts';
import { findPeaks, halfPowerBins, interpolatePeak } from './peaks.ts';

export type ModeFlag =
	| 'coarse-resolution'
	| 'short-record'
	| 'clipping'
	| 'double-hit'
	| 'damping-disagreement'
	| 'poor-envelope-fit';

export const FLAG_TEXT: Record<ModeFlag, string> = {
	'coarse-resolution': 'frequency resolution too coarse for this bandwidth: record longer',
	'short-record': 'record shorter than six time constants: damping is uncertain',
	clipping: 'the signal is clipped: reduce the sensor range or hit softer',
	'double-hit': 'a second hit follows the first: repeat the hit',
	'damping-disagreement': 'half-power and decay estimates of damping disagree',
	'poor-envelope-fit': 'the decay of this mode is not a clean exponential'
};

export interface RingdownOptions {
	/**
	 * zero padding: the FFT length is nextPow2(n) × this (1, 2, 4 …). By default records are
	 * padded to twice their length up to 65,536 points; longer records already give a grid finer
	 * than their frequency resolution needs, and are not padded.
	 */
	zeroPad?: number;
	/** most modes reported (default 6) */
	maxModes?: number;
	/** smallest prominence kept, as a fraction of the tallest peak (default 0.02) */
	minProminence?: number;
	minFrequencyHz?: number;
	maxFrequencyHz?: number;
	/** exponential window time constant τ_w, s (none by default) */
	exponentialWindowS?: number | null;
	/** relative difference of the two damping estimates that raises a flag (default 0.3) */
	disagreement?: number;
	onProgress?: (fraction: number) => void;
}

export interface RingdownMode {
	frequencyHz: number;
	/** the reported damping ratio: the envelope estimate when its fit is clean, else half-power */
	dampingRatio: number | null;
	qFactor: number | null;
	/** initial amplitude of the mode, in the recording's unit (from the envelope; else the spectrum) */
	amplitude: number;
	halfPowerDamping: number | null;
	decayDamping: number | null;
	/** half-power points, Hz */
	halfPowerHz: [number, number] | null;
	prominence: number;
	flags: ModeFlag[];
}

export interface RingdownResult {
	modes: RingdownMode[];
	/** peaks that did not decay: steady tones, not modes */
	tones: { frequencyHz: number; amplitude: number }[];
	sampleRateHz: number;
	samples: number;
	durationS: number;
	/** the frequency resolution 1/T of the analysed segment, Hz */
	resolutionHz: number;
	nfft: number;
	hitIndex: number;
	flags: ModeFlag[];
	/** for charts: the spectrum (≤ 2048 points) and the waveform with its RMS envelope (≤ 2000) */
	spectrum: { frequencyHz: number[]; magnitude: number[] };
	waveform: { timeS: number[]; value: number[]; envelope: number[] };
}

const DEFAULTS = { maxModes: 6, minProminence: 0.02, disagreement: 0.3 };
const PAD_UP_TO = 65_536;

/** Removes mean and linear trend (least squares), in place on a copy. */
export function detrend(x: ArrayLike<number>): Float64Array {
	const n = x.length;
	const y = new Float64Array(n);
	let st = 0;
	let sx = 0;
	for (let i = 0; i < n; i++) {
		st += i;
		sx += x[i];
	}
	const mt = st / n;
	const mx = sx / n;
	let num = 0;
	let den = 0;
	for (let i = 0; i < n; i++) {
		num += (i - mt) * (x[i] - mx);
		den += (i - mt) * (i - mt);
	}
	const slope = den > 0 ? num / den : 0;
	for (let i = 0; i < n; i++) y[i] = x[i] - mx - slope * (i - mt);
	return y;
}

/** Flat tops at the largest magnitude, in two or more places: what an overloaded input looks like. */
export function isClipped(x: ArrayLike<number>): boolean {
	let max = 0;
	for (let i = 0; i < x.length; i++) max = Math.max(max, Math.abs(x[i]));
	if (max === 0) return false;
	let runs = 0;
	let len = 0;
	for (let i = 0; i < x.length; i++) {
		if (Math.abs(x[i]) >= max * (1 - 1e-9)) len++;
		else {
			if (len >= 2) runs++;
			len = 0;
		}
	}
	if (len >= 2) runs++;
	return runs >= 2;
}

/** RMS over consecutive windows of `w` samples. */
function rmsEnvelope(x: ArrayLike<number>, w: number): Float64Array {
	const m = Math.floor(x.length / w);
	const e = new Float64Array(m);
	for (let b = 0; b < m; b++) {
		let s = 0;
		for (let i = b * w; i < (b + 1) * w; i++) s += x[i] * x[i];
		e[b] = Math.sqrt(s / w);
	}
	return e;
}

/**
 * A second hit shows as the RMS envelope jumping back up after it had started to fall: a window
 * more than twice the lowest window since the first peak, and above a fifth of that peak.
 */
export function hasSecondHit(x: ArrayLike<number>, sampleRateHz: number): boolean {
	const w = Math.max(4, Math.round(sampleRateHz * 0.01));
	const e = rmsEnvelope(x, w);
	let peak = 0;
	let peakAt = 0;
	for (let i = 0; i < e.length; i++) if (e[i] > peak) [peak, peakAt] = [e[i], i];
	let low = peak;
	for (let i = peakAt + 1; i < e.length; i++) {
		low = Math.min(low, e[i]);
		if (e[i] > 2 * low && e[i] > 0.2 * peak) return true;
	}
	return false;
}

/**
 * Envelope of one mode by complex demodulation at f (Hz) and a low-pass of about L samples: the
 * mixed signal is block-averaged over D = L/8 samples (itself a low-pass), then smoothed by two
 * passes of a centred moving average (a triangle). Returns |envelope|·2 in signal units, one value
 * per block; value k stands for sample k·D + D/2.
 */
function demodulatedEnvelope(
	x: Float64Array,
	fs: number,
	f: number,
	L: number
): { env: Float64Array; step: number } {
	const n = x.length;
	const D = Math.max(1, Math.floor(L / 8));
	const m = Math.floor(n / D);
	const re = new Float64Array(m);
	const im = new Float64Array(m);
	const w = (2 * Math.PI * f) / fs;
	// rotate with a recurrence (renormalised now and then): cos/sin per sample would dominate
	const cw = Math.cos(w);
	const sw = Math.sin(w);
	let c = 1;
	let s = 0;
	for (let b = 0; b < m; b++) {
		let sr = 0;
		let si = 0;
		for (let i = b * D, e = i + D; i < e; i++) {
			sr += x[i] * c;
			si -= x[i] * s;
			const c2 = c * cw - s * sw;
			s = s * cw + c * sw;
			c = c2;
		}
		re[b] = sr / D;
		im[b] = si / D;
		const r = Math.sqrt(c * c + s * s);
		c /= r;
		s /= r;
	}
	const Lb = Math.max(1, Math.round(L / D));
	const a = movingAverage(movingAverage(re, Lb), Lb);
	const bb = movingAverage(movingAverage(im, Lb), Lb);
	const env = new Float64Array(m);
	for (let i = 0; i < m; i++) env[i] = 2 * Math.sqrt(a[i] * a[i] + bb[i] * bb[i]);
	return { env, step: D };
}

function movingAverage(x: Float64Array, L: number): Float64Array {
	const n = x.length;
	const out = new Float64Array(n);
	const h = Math.floor(L / 2);
	let sum = 0;
	let count = 0;
	// centred window [i − h, i + h]
	for (let i = 0; i < Math.min(n, h); i++) {
		sum += x[i];
		count++;
	}
	for (let i = 0; i < n; i++) {
		const add = i + h;
		if (add < n) {
			sum += x[add];
			count++;
		}
		const drop = i - h - 1;
		if (drop >= 0) {
			sum -= x[drop];
			count--;
		}
		out[i] = sum / count;
	}
	return out;
}

/** Straight line through (t, ln env) over env[from … to), value k at time (k·step + step/2)/fs: slope, intercept, R². */
function logLinearFit(env: Float64Array, fs: number, from: number, to: number, step: number) {
	let n = 0;
	let st = 0;
	let sy = 0;
	let stt = 0;
	let sty = 0;
	let syy = 0;
	for (let i = from; i < to; i++) {
		if (env[i] <= 0) continue;
		const t = (i * step + step / 2) / fs;
		const y = Math.log(env[i]);
		n++;
		st += t;
		sy += y;
		stt += t * t;
		sty += t * y;
		syy += y * y;
	}
	if (n < 8) return null;
	const vt = stt - (st * st) / n;
	const vy = syy - (sy * sy) / n;
	if (vt <= 0) return null;
	const slope = (sty - (st * sy) / n) / vt;
	const intercept = (sy - slope * st) / n;
	const r2 = vy > 0 ? (slope * slope * vt) / vy : 0;
	return { slope, intercept, r2, points: n };
}

function validateSamples(samples: ArrayLike<number>): void {
	if (!samples || typeof samples.length !== 'number')
		throw new VibrationInputError('samples', 'a list of numbers', samples);
	integerAtLeast('number of samples', samples.length, 64);
	for (let i = 0; i < samples.length; i++) {
		const v = samples[i];
		if (typeof v !== 'number' || !Number.isFinite(v))
			throw new VibrationInputError(`samples[${i}]`, 'a finite number', v);
	}
}

/**
 * The modes of a ring-down recording, strongest first. `samples` in any unit (g, m/s², mm/s …);
 * amplitudes come back in the same unit.
 */
export function analyzeRingdown(
	samples: ArrayLike<number>,
	sampleRateHz: number,
	options: RingdownOptions = {}
): RingdownResult {
	validateSamples(samples);
	const fs = positive('sampleRateHz', sampleRateHz);
	const opt = { ...DEFAULTS, ...options };
	const maxModes = integerAtLeast('maxModes', opt.maxModes, 1);
	const minProm = positive('minProminence', opt.minProminence);
	const tauW =
		opt.exponentialWindowS === null || opt.exponentialWindowS === undefined
			? null
			: positive('exponentialWindowS', opt.exponentialWindowS);
	const progress = opt.onProgress ?? (() => {});

	const clipped = isClipped(samples);
	const x0 = detrend(samples);
	progress(0.05);
	// the hit: the first sample above a tenth of the largest, less a short pre-trigger
	let max = 0;
	for (let i = 0; i < x0.length; i++) max = Math.max(max, Math.abs(x0[i]));
	if (max === 0)
		throw new VibrationInputError(
			'samples',
			'a signal that is not constant (this recording is flat)',
			'flat'
		);
	let hit = 0;
	while (hit < x0.length && Math.abs(x0[hit]) < 0.1 * max) hit++;
	const start = Math.max(0, hit - Math.round(0.002 * fs));
	const x = x0.subarray(start);
	const n = x.length;
	if (n < 64) throw new VibrationInputError('samples', 'at least 64 samples after the hit', n);
	const doubleHit = hasSecondHit(x, fs);
	const recordFlags: ModeFlag[] = [
		...(clipped ? (['clipping'] as const) : []),
		...(doubleHit ? (['double-hit'] as const) : [])
	];

	let windowed: Float64Array = x;
	if (tauW !== null) {
		windowed = new Float64Array(n);
		for (let i = 0; i < n; i++) windowed[i] = x[i] * Math.exp(-i / fs / tauW);
	}
	const nfft =
		opt.zeroPad !== undefined
			? Math.min(nextPow2(n) * nextPow2(integerAtLeast('zeroPad', opt.zeroPad, 1)), 1 << 22)
			: Math.min(2 * nextPow2(n), Math.max(nextPow2(n), PAD_UP_TO));
	const spec = realFft(windowed, nfft);
	const mag = magnitude(spec);
	progress(0.45);
	const df = fs / nfft;
	const T = n / fs;
	const resolution = 1 / T;
	const fMin = Math.max(opt.minFrequencyHz ?? 0, 2 * resolution);
	const fMax = Math.min(opt.maxFrequencyHz ?? Infinity, 0.45 * fs);
	let tallest = 0;
	for (let k = Math.ceil(fMin / df); k <= Math.floor(fMax / df) && k < mag.length; k++)
		tallest = Math.max(tallest, mag[k]);
	const peaks = findPeaks(
		mag,
		Math.ceil(fMin / df),
		Math.floor(fMax / df),
		tallest * minProm,
		Math.round((2 * resolution) / df)
	)
		.filter((p) => p.prominence >= tallest * minProm)
		.sort((a, b) => b.prominence - a.prominence);
	// keep peaks at least two resolution steps from a more prominent one
	const kept: typeof peaks = [];
	for (const p of peaks)
		if (kept.every((q) => Math.abs(q.bin - p.bin) * df >= 2 * resolution)) kept.push(p);
	const candidates = kept.slice(0, maxModes + 2);

	const modes: RingdownMode[] = [];
	const tones: RingdownResult['tones'] = [];
	candidates.forEach((p, idx) => {
		progress(0.45 + (0.5 * idx) / Math.max(1, candidates.length));
		const ip = interpolatePeak(mag, p.bin);
		const f = ip.bin * df;
		const hp = halfPowerBins(mag, p.bin, ip.height);
		const windowDamping = tauW === null ? 0 : 1 / (2 * Math.PI * f * tauW);
		const hpHz: [number, number] | null = hp ? [hp[0] * df, hp[1] * df] : null;
		const hpDamping = hpHz ? Math.max(0, (hpHz[1] - hpHz[0]) / (2 * f) - windowDamping) : null;
		// envelope: reject the neighbours (nearest other candidate) and the 2f image
		const others = candidates.filter((q) => q !== p).map((q) => Math.abs(q.bin - p.bin) * df);
		const nearest = others.length ? Math.min(...others) : Infinity;
		const L = Math.min(Math.floor(n / 8), Math.max(8, Math.ceil((2 * fs) / Math.min(nearest, f))));
		// the envelope is needed only until the mode has rung down: ten time constants by the
		// half-power estimate (σ = π·(f₂ − f₁)), plus the filter's length at each end
		const span = hpHz
			? Math.min(n, Math.ceil((fs * 10) / (Math.PI * (hpHz[1] - hpHz[0]))) + 8 * L)
			: n;
		const { env, step } = demodulatedEnvelope(span < n ? x.subarray(0, span) : x, fs, f, L);
		const m = env.length;
		// skip the filter's start-up and its end (2L samples each), then stop in the noise
		const edge = Math.ceil((2 * L) / step);
		const from = Math.min(m - 1, edge);
		let to = m - edge;
		let envPeak = 0;
		for (let i = from; i < to; i++) envPeak = Math.max(envPeak, env[i]);
		let floor = Infinity;
		for (let i = Math.max(from, to - Math.floor(m / 10)); i < to; i++)
			floor = Math.min(floor, env[i]);
		if (floor < 0.1 * envPeak) {
			let i = from;
			while (i < to && env[i] > Math.max(3 * floor, 0.01 * envPeak)) i++;
			to = i;
		}
		const fit = to - from > 8 ? logLinearFit(env, fs, from, to, step) : null;
		const sigma = fit ? -fit.slope : null;
		const w = 2 * Math.PI * f;
		const decayDamping =
			sigma !== null && sigma > 0 ? sigma / Math.hypot(sigma, w) : sigma !== null ? 0 : null;
		const cleanFit = fit !== null && fit.r2 >= 0.95 && fit.points >= 8;
		// a peak whose envelope falls by less than a fifth over the whole record, and as narrow as
		// the resolution allows, is a steady tone
		const steady =
			(sigma === null || sigma * T < 0.2) && (hpHz === null || hpHz[1] - hpHz[0] < 3 * resolution);
		if (steady) {
			tones.push({
				frequencyHz: f,
				amplitude: fit ? Math.exp(fit.intercept) : (2 * ip.height) / n
			});
			return;
		}
		if (modes.length >= maxModes) return;
		const zeta = cleanFit && decayDamping !== null && decayDamping > 0 ? decayDamping : hpDamping;
		const flags: ModeFlag[] = [...recordFlags];
		if (hpHz && hpHz[1] - hpHz[0] < 5 * resolution) flags.push('coarse-resolution');
		if (zeta !== null && zeta > 0 && T < 6 / (zeta * w)) flags.push('short-record');
		if (!cleanFit) flags.push('poor-envelope-fit');
		if (
			hpDamping !== null &&
			decayDamping !== null &&
			cleanFit &&
			Math.abs(hpDamping - decayDamping) / Math.max(hpDamping, decayDamping) > opt.disagreement
		)
			flags.push('damping-disagreement');
		modes.push({
			frequencyHz: f,
			dampingRatio: zeta !== null && zeta > 0 ? zeta : null,
			qFactor: zeta !== null && zeta > 0 ? 1 / (2 * zeta) : null,
			amplitude: fit && cleanFit ? Math.exp(fit.intercept) : (2 * ip.height) / n,
			halfPowerDamping: hpDamping,
			decayDamping,
			halfPowerHz: hpHz,
			prominence: p.prominence / tallest,
			flags
		});
	});
	modes.sort((a, b) => b.amplitude - a.amplitude);

	// chart data, decimated without building full-length arrays
	const scale = 2 / n;
	const kEnd = Math.min(mag.length, Math.ceil(Math.min(fMax, 0.5 * fs) / df) + 1);
	const spectrum = bucketMax(
		kEnd,
		2048,
		(k) => mag[k] * scale,
		(k) => k * df
	);
	const envW = Math.max(1, Math.floor(x0.length / 500));
	const rms = rmsEnvelope(x0, envW);
	const wave = bucketMax(
		x0.length,
		2000,
		(i) => x0[i],
		(i) => i / fs
	);
	const envelope = wave.x.map(
		(t) => Math.SQRT2 * (rms[Math.min(rms.length - 1, Math.floor((t * fs) / envW))] ?? 0)
	);
	progress(1);
	return {
		modes,
		tones,
		sampleRateHz: fs,
		samples: samples.length,
		durationS: samples.length / fs,
		resolutionHz: resolution,
		nfft,
		hitIndex: hit,
		flags: recordFlags,
		spectrum: { frequencyHz: spectrum.x, magnitude: spectrum.y },
		waveform: { timeS: wave.x, value: wave.y, envelope }
	};
}

/** A finite check of a sample rate given by a person (CSV without a time column, WAV header). */
export function validSampleRate(value: unknown): number {
	const v = finite('sample rate (Hz)', value);
	if (v <= 0) throw new VibrationInputError('sample rate (Hz)', 'greater than zero', v);
	return v;
}
