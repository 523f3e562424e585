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
