/**
 * Spectra with fft.js (a radix-4 FFT from the registry). Transforms are cached per size, since a
 * batch of recordings reuses the same lengths.
 */
import FFT from 'fft.js';
import { integerAtLeast, VibrationInputError } from '../errors.ts';

const instances = new Map<number, FFT>();

export function nextPow2(n: number): number {
	let p = 1;
	while (p < n) p *= 2;
	return p;
}

const buffers = new Map<number, { input: Float64Array; out: Float64Array }>();
/** Work buffers per size (one analysis uses two or three sizes in turn). */
function buffersFor(size: number) {
	let b = buffers.get(size);
	if (!b) {
		if (buffers.size > 4) buffers.clear();
		b = { input: new Float64Array(size), out: new Float64Array(2 * size) };
		buffers.set(size, b);
	}
	return b;
}

function fftOf(size: number): FFT {
	let f = instances.get(size);
	if (!f) {
		f = new FFT(size);
		if (instances.size > 16) instances.clear();
		instances.set(size, f);
	}
	return f;
}

export interface OneSided {
	/** real and imaginary parts of bins 0 … nfft/2 */
	re: Float64Array;
	im: Float64Array;
	nfft: number;
}

/**
 * One-sided DFT X_k = Σ x_n e^(−2πikn/N) of real `x` zero-padded to `nfft` (a power of two ≥ 4),
 * bins k = 0 … nfft/2.
 */
export function realFft(x: ArrayLike<number>, nfft: number): OneSided {
	integerAtLeast('nfft', nfft, 4);
	if (nfft !== nextPow2(nfft)) throw new VibrationInputError('nfft', 'a power of two', nfft);
	if (x.length > nfft)
		throw new VibrationInputError('nfft', `at least the signal length ${x.length}`, nfft);
	const f = fftOf(nfft);
	// work buffers are kept per size: a batch of recordings would otherwise allocate megabytes each
	const { input, out } = buffersFor(nfft);
	for (let i = 0; i < x.length; i++) input[i] = x[i];
	input.fill(0, x.length);
	f.realTransform(out, input);
	const half = nfft / 2;
	const re = new Float64Array(half + 1);
	const im = new Float64Array(half + 1);
	for (let k = 0; k <= half; k++) {
		re[k] = out[2 * k];
		im[k] = out[2 * k + 1];
	}
	return { re, im, nfft };
}

/** |X_k|, k = 0 … nfft/2, of real `x` zero-padded to `nfft`: realFft then magnitude, in one pass. */
export function magnitudeSpectrum(x: ArrayLike<number>, nfft: number): Float64Array {
	integerAtLeast('nfft', nfft, 4);
	if (nfft !== nextPow2(nfft)) throw new VibrationInputError('nfft', 'a power of two', nfft);
	if (x.length > nfft)
		throw new VibrationInputError('nfft', `at least the signal length ${x.length}`, nfft);
	const { input, out } = buffersFor(nfft);
	for (let i = 0; i < x.length; i++) input[i] = x[i];
	input.fill(0, x.length);
	fftOf(nfft).realTransform(out, input);
	const m = new Float64Array(nfft / 2 + 1);
	for (let k = 0; k < m.length; k++) {
		const re = out[2 * k];
		const im = out[2 * k + 1];
		m[k] = Math.sqrt(re * re + im * im);
	}
	return m;
}

const windows = new Map<string, Float64Array>();

/**
 * The Hann window of length n: periodic (0.5 − 0.5·cos(2πi/n), for spectra of a stretch of a
 * longer signal) or symmetric (…/(n − 1), zero at both ends). Cached per length.
 */
export function hannWindow(n: number, form: 'periodic' | 'symmetric' = 'periodic'): Float64Array {
	integerAtLeast('window length', n, 2);
	const key = `${form}${n}`;
	let w = windows.get(key);
	if (!w) {
		const d = form === 'periodic' ? n : n - 1;
		w = new Float64Array(n);
		for (let i = 0; i < n; i++) w[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / d);
		if (windows.size > 8) windows.clear();
		windows.set(key, w);
	}
	return w;
}

let segment: Float64Array | null = null;

/**
 * The amplitude spectrum of x[from … from + window.length) under `window`, zero-padded to `nfft`
 * (default the window's length) and scaled so a sine on a bin reads its amplitude (2|X|/Σw).
 */
export function windowedAmplitude(
	x: ArrayLike<number>,
	from: number,
	window: Float64Array,
	nfft = nextPow2(window.length)
): Float64Array {
	const len = window.length;
	if (from < 0 || from + len > x.length)
		throw new VibrationInputError('segment', `inside the signal of ${x.length}`, from + len);
	const seg = (segment = segment?.length === len ? segment : new Float64Array(len));
	let wsum = 0;
	for (let i = 0; i < len; i++) {
		seg[i] = x[from + i] * window[i];
		wsum += window[i];
	}
	const mag = magnitudeSpectrum(seg, nfft);
	for (let k = 0; k < mag.length; k++) mag[k] *= 2 / wsum;
	return mag;
}

/** The largest of each run of `per` values of `values[from … to)`, for a display. */
export function runMaxima(
	values: ArrayLike<number>,
	from: number,
	to: number,
	per: number
): Float64Array {
	const n = Math.max(0, Math.ceil((to - from) / per));
	const out = new Float64Array(n);
	for (let c = 0; c < n; c++) {
		let m = 0;
		for (let k = from + c * per; k < Math.min(to, from + (c + 1) * per); k++)
			m = Math.max(m, values[k]);
		out[c] = m;
	}
	return out;
}

/** |X_k| of a one-sided spectrum. */
export function magnitude(s: OneSided): Float64Array {
	const m = new Float64Array(s.re.length);
	for (let k = 0; k < m.length; k++) m[k] = Math.sqrt(s.re[k] * s.re[k] + s.im[k] * s.im[k]);
	return m;
}

/**
 * Reduces a long series to at most `points` (x, y) pairs for a chart, each the largest |y| of its
 * bucket (so peaks survive). Values are read through functions, so no full-length array is built.
 */
export function bucketMax(
	n: number,
	points: number,
	y: (i: number) => number,
	x: (i: number) => number
): { x: number[]; y: number[] } {
	const xs: number[] = [];
	const ys: number[] = [];
	const per = Math.max(1, n / points);
	for (let b = 0; b * per < n; b++) {
		const s = Math.floor(b * per);
		const e = Math.min(n, Math.floor((b + 1) * per));
		let best = s;
		let bv = Math.abs(y(s));
		for (let i = s + 1; i < e; i++) {
			const v = Math.abs(y(i));
			if (v > bv) {
				best = i;
				bv = v;
			}
		}
		xs.push(x(best));
		ys.push(y(best));
	}
	return { x: xs, y: ys };
}

/**
 * The analytic signal of one band: bins k1 … k2 of a one-sided spectrum, doubled, everything else
 * zero, transformed back (fft.js inverse, which divides by N). Its magnitude is the band's
 * envelope and its phase the band's oscillation, with no image at twice the frequency. Returns the
 * first `length` samples.
 */
export function analyticBand(
	s: OneSided,
	k1: number,
	k2: number,
	length: number
): { re: Float64Array; im: Float64Array } {
	const f = fftOf(s.nfft);
	const input = f.createComplexArray() as number[];
	const out = f.createComplexArray() as number[];
	for (let k = Math.max(1, k1); k <= Math.min(s.re.length - 1, k2); k++) {
		input[2 * k] = 2 * s.re[k];
		input[2 * k + 1] = 2 * s.im[k];
	}
	f.inverseTransform(out, input);
	const n = Math.min(length, s.nfft);
	const re = new Float64Array(n);
	const im = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		re[i] = out[2 * i];
		im[i] = out[2 * i + 1];
	}
	return { re, im };
}
