/**
 * Bump-test (ring-down) analysis of a response-only recording: the modes it holds, each with its
 * natural frequency and its damping estimated two ways, on a machine that may be running.
 *
 * Method (../shared/domain.md §6.1; Trethewey & Cafeo 1992; Ewins, Modal Testing §4):
 * 1. remove mean and linear trend; flag clipping;
 * 2. steady tones (running speed, its orders, line frequency): a peak present with the same level
 *    in every eighth of the record is a tone. Its frequency is refined on the whole record, its
 *    amplitude and phase fitted by least squares on the parts without the hit's ring-down (before
 *    the hit and the last quarter), and it is subtracted, so it neither hides the hit nor takes a
 *    mode's place nor sets the peak threshold;
 * 3. the hit: the first short window whose RMS rises 8× (18 dB) above the pre-hit level, found on
 *    the signal without its tones; a second hit is flagged;
 * 4. optionally an exponential window e^(−t/τ_w) from the hit (its added damping Δζ = 1/(ω_n·τ_w)
 *    is subtracted again);
 * 5. zero-padded FFT (fft.js); peaks above the spectrum's noise floor (5× its median) and above a
 *    fraction of the tallest decaying peak, frequency by Gaussian interpolation;
 * 6. per mode, complex demodulation at the peak: the envelope's log-linear slope gives σ = ζω_n
 *    (F4) and the phase slope the damped frequency f_d; then f_n = √(f_d² + (σ/2π)²). Half-power
 *    damping ζ = (f₂ − f₁)/(2f) (F5) only where that approximation holds (ζ ≤ 0.1);
 * 7. one amplitude for ranking: the peak's DFT magnitude undone for the mode's decay over the
 *    analysed record, so it does not depend on how long the record runs;
 * 8. quality flags beside each estimate (resolution, short record, clipping, double hit, poor fit,
 *    damping disagreement, a close neighbour, a tone nearby, heavy damping).
 */
import { finite, integerAtLeast, positive, VibrationInputError } from '../errors.ts';
import { halfPowerExact, type ResponseKind } from '../damping.ts';
import {
	analyticBand,
	bucketMax,
	hannWindow,
	magnitudeSpectrum,
	nextPow2,
	realFft,
	windowedAmplitude
} from './spectrum.ts';
import { findPeaks, halfPowerBins, interpolatePeak } from './peaks.ts';

export type ModeFlag =
	| 'coarse-resolution'
	| 'short-record'
	| 'clipping'
	| 'double-hit'
	| 'damping-disagreement'
	| 'poor-envelope-fit'
	| 'close-mode'
	| 'tone-nearby'
	| 'heavy-damping'
	| 'half-power-invalid'
	| 'not-repeatable';

export const FLAG_TEXT: Record<ModeFlag, string> = {
	'coarse-resolution': 'frequency resolution too coarse for this bandwidth: record longer',
	'short-record': 'record shorter than six time constants: damping is uncertain',
	clipping: 'the signal is clipped: reduce the sensor range or hit softer',
	'double-hit': 'a second hit follows the first: repeat the hit',
	'damping-disagreement': 'half-power and decay estimates of damping disagree',
	'poor-envelope-fit': 'the decay of this mode is not a clean exponential',
	'close-mode':
		'another mode lies within a few resolution steps: the two beat, so damping and amplitude are uncertain',
	'tone-nearby':
		'a steady tone of the running machine lies close by: check it on a stopped machine',
	'heavy-damping': 'heavily damped (ζ > 0.1): the peak is broad and its frequency less sharp',
	'half-power-invalid':
		'half-power damping is not reliable above ζ ≈ 0.3: the decay estimate is reported',
	'not-repeatable':
		'found after fewer than half of the hits in this record: check it with more hits'
};

/** How a mode's frequency was found. */
export type FrequencySource = 'decay-fit' | 'spectral-peak';

export interface RingdownOptions {
	/**
	 * zero padding: the FFT length is nextPow2(n) × this (1, 2, 4 …). By default records are
	 * padded to twice their length up to 65,536 points; longer records already give a grid finer
	 * than their frequency resolution needs, and are not padded.
	 */
	zeroPad?: number;
	/** most modes reported (default 6) */
	maxModes?: number;
	/** smallest prominence kept, as a fraction of the tallest decaying peak (default 0.02) */
	minProminence?: number;
	/** peaks must also stand this many times above the spectrum's median (noise floor; default 5) */
	noiseFactor?: number;
	minFrequencyHz?: number;
	maxFrequencyHz?: number;
	/** exponential window time constant τ_w, s (none by default) */
	exponentialWindowS?: number | null;
	/** relative difference of the two damping estimates that raises a flag (default 0.3) */
	disagreement?: number;
	/** what the samples measure, for the exact half-power form (default acceleration) */
	responseKind?: ResponseKind;
	onProgress?: (fraction: number) => void;
	/**
	 * a record of the running machine without hits, same sensor and sample rate: its averaged
	 * power spectrum is subtracted from each hit's (spectral subtraction), so what the machine does
	 * by itself neither hides a mode nor passes for one
	 */
	background?: ArrayLike<number> | null;
}

export interface RingdownMode {
	/** the natural frequency f_n, Hz (from the decay fit; else the spectral peak, see frequencySource) */
	frequencyHz: number;
	/** the damped frequency f_d = f_n √(1 − ζ²) the record rings at, Hz */
	dampedFrequencyHz: number;
	frequencySource: FrequencySource;
	/** the reported damping ratio: the envelope estimate when its fit is clean, else half-power */
	dampingRatio: number | null;
	qFactor: number | null;
	/** initial amplitude of the mode in the recording's unit: the spectral peak undone for the decay */
	amplitude: number;
	halfPowerDamping: number | null;
	decayDamping: number | null;
	/** half-power points, Hz */
	halfPowerHz: [number, number] | null;
	prominence: number;
	/** in a record of several hits, how many of them showed this mode (1 for a single hit) */
	hits: number;
	/** the spread (max − min) of this mode's frequency across those hits, Hz (0 for one hit) */
	frequencySpreadHz: number;
	flags: ModeFlag[];
}

export interface RingdownResult {
	modes: RingdownMode[];
	/** steady tones (running speed, orders, line), found and subtracted before the modes */
	tones: { frequencyHz: number; amplitude: number }[];
	/** RMS of the record before the hit, tones removed, in the recording's unit */
	preHitRms: number;
	sampleRateHz: number;
	samples: number;
	durationS: number;
	/** the frequency resolution 1/T of the analysed segment, Hz */
	resolutionHz: number;
	nfft: number;
	/** the (first) hit, as a sample index of the record */
	hitIndex: number;
	/** hits found in the record, each analysed on its own and the modes combined (median) */
	hitIndices: number[];
	/** stretches of the background record averaged and subtracted (0: none given) */
	backgroundSegments: number;
	flags: ModeFlag[];
	/** for charts: the spectrum (≤ 2048 points) and the waveform with its RMS envelope (≤ 2000) */
	spectrum: { frequencyHz: number[]; magnitude: number[] };
	waveform: { timeS: number[]; value: number[]; envelope: number[] };
}

const DEFAULTS = { maxModes: 6, minProminence: 0.02, noiseFactor: 5, disagreement: 0.3 };
/** above this ζ a peak is broad: its frequency is less sharp (common practice) */
const HEAVY_DAMPING = 0.1;
/**
 * half-power damping (exact for the response measured, halfPowerExact) is used up to this ζ: the
 * lower point vanishes near 0.38, and the peak's flanks then overlap its neighbours' (common
 * practice)
 */
const HALF_POWER_LIMIT = 0.3;
const PAD_UP_TO = 65_536;
/** a hit's analysed part is at most this long: 41 s at 51.2 kHz, far past any ring-down */
const MAX_SEGMENT = 1 << 21;

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
 * 10 ms windows' mean square, and the windows where it jumps `ratio`× over the mean of the 100 ms
 * before and reaches `share` of the loudest window. A hit is such a jump; a ring-down's own
 * beating, or a low mode's zero crossings, rise over tens of milliseconds and never jump.
 */
function energyJumps(x: ArrayLike<number>, fs: number, ratio: number, share: number, ahead = 0) {
	const w = Math.max(8, Math.round(0.01 * fs));
	const m = Math.floor(x.length / w);
	const e = new Float64Array(m);
	let loudest = 0;
	let loudestAt = 0;
	for (let b = 0; b < m; b++) {
		let sum = 0;
		for (let i = b * w, end = i + w; i < end; i++) sum += x[i] * x[i];
		e[b] = sum / w;
		if (e[b] > loudest) {
			loudest = e[b];
			loudestAt = b;
		}
	}
	const jumps: number[] = [];
	let pre = 0;
	for (let b = 0; b < Math.min(10, m); b++) pre += e[b];
	for (let b = 10; b < m; b++) {
		let v = e[b];
		for (let k = b + 1; k <= Math.min(m - 1, b + ahead); k++) if (e[k] > v) v = e[k];
		if (v > ratio * (pre / 10) && v > share * loudest) jumps.push(b);
		pre += e[b] - e[b - 10];
	}
	return { w, e, loudest, loudestAt, jumps };
}

/**
 * A second hit within one hit's ring-down: after the loudest window, a window whose mean square
 * jumps 4× (2× in amplitude) over the 100 ms before it and reaches a twenty-fifth of the loudest
 * (a fifth in amplitude).
 */
export function hasSecondHit(x: ArrayLike<number>, sampleRateHz: number): boolean {
	const { jumps, loudestAt } = energyJumps(x, sampleRateHz, 4, 1 / 25);
	return jumps.some((b) => b > loudestAt + 2);
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
): { env: Float64Array; re: Float64Array; im: Float64Array; step: number } {
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
	return { env, re: a, im: bb, step: D };
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

/** A least-squares straight line y = slope·t + intercept, fed one point at a time. */
class LineFit {
	n = 0;
	#st = 0;
	#sy = 0;
	#stt = 0;
	#sty = 0;
	#syy = 0;
	add(t: number, y: number): void {
		this.n++;
		this.#st += t;
		this.#sy += y;
		this.#stt += t * t;
		this.#sty += t * y;
		this.#syy += y * y;
	}
	/** slope, intercept and R², or null with fewer than `least` points or no spread in t */
	result(least: number): { slope: number; intercept: number; r2: number; points: number } | null {
		const n = this.n;
		if (n < least) return null;
		const vt = this.#stt - (this.#st * this.#st) / n;
		const vy = this.#syy - (this.#sy * this.#sy) / n;
		if (vt <= 0) return null;
		const slope = (this.#sty - (this.#st * this.#sy) / n) / vt;
		const intercept = (this.#sy - slope * this.#st) / n;
		return { slope, intercept, r2: vy > 0 ? (slope * slope * vt) / vy : 0, points: n };
	}
}

/** Straight line through (t, ln env) over env[from … to), value k at time (k·step + step/2)/fs: slope, intercept, R². */
function logLinearFit(env: Float64Array, fs: number, from: number, to: number, step: number) {
	const fit = new LineFit();
	for (let i = from; i < to; i++)
		if (env[i] > 0) fit.add((i * step + step / 2) / fs, Math.log(env[i]));
	return fit.result(8);
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

/** Slope of the unwrapped phase of (re, im)[from … to) against time, rad/s (null when too short). */
function phaseSlope(
	re: Float64Array,
	im: Float64Array,
	fs: number,
	from: number,
	to: number,
	step: number
): number | null {
	if (to - from < 8) return null;
	let prev = Math.atan2(im[from], re[from]);
	let unwrapped = prev;
	const fit = new LineFit();
	for (let i = from; i < to; i++) {
		const ph = Math.atan2(im[i], re[i]);
		let d = ph - prev;
		if (d > Math.PI) d -= 2 * Math.PI;
		else if (d < -Math.PI) d += 2 * Math.PI;
		unwrapped += d;
		prev = ph;
		fit.add((i * step + step / 2) / fs, unwrapped);
	}
	return fit.result(2)?.slope ?? null;
}

/**
 * The median of xs[from … to), as a noise floor: from at most 1,024 evenly spaced values (a
 * spectrum's median needs no more, and sorting 32,768 bins per record cost more than its FFT).
 */
function medianLevel(xs: Float64Array, from: number, to: number): number {
	const count = Math.max(0, to - from);
	if (count === 0) return 0;
	const take = Math.min(count, 1024);
	const pick = new Float64Array(take);
	for (let i = 0; i < take; i++) pick[i] = xs[from + Math.floor((i * count) / take)];
	pick.sort();
	return pick[take >> 1];
}

/**
 * cos(wk) + i sin(wk) for k = 0, 1, 2 … by rotation, renormalised every 1,024 steps against drift:
 * a cosine per sample cost four times the rest of the loops it serves.
 */
class Phasor {
	c = 1;
	s = 0;
	k = 0;
	readonly cw: number;
	readonly sw: number;
	constructor(w: number) {
		this.cw = Math.cos(w);
		this.sw = Math.sin(w);
	}
	step() {
		const c = this.c * this.cw - this.s * this.sw;
		this.s = this.s * this.cw + this.c * this.sw;
		this.c = c;
		if ((++this.k & 1023) === 0) {
			const r = Math.sqrt(this.c * this.c + this.s * this.s);
			this.c /= r;
			this.s /= r;
		}
	}
}

/**
 * |Σ x e^(−iωt)| over x under a Hann window: the projection a tone's frequency maximises. Both the
 * phasor and the window turn by recurrence (Phasor).
 */
function projection(x: Float64Array, fs: number, f: number): number {
	const n = x.length;
	const p = new Phasor((2 * Math.PI * f) / fs);
	const h = new Phasor((2 * Math.PI) / (n - 1)); // for the window 0.5 − 0.5 cos(v·i)
	let re = 0;
	let im = 0;
	for (let i = 0; i < n; i++) {
		const hx = (0.5 - 0.5 * h.c) * x[i];
		re += hx * p.c;
		im -= hx * p.s;
		p.step();
		h.step();
	}
	return Math.sqrt(re * re + im * im);
}

/** Solves the small symmetric system A·p = y in place (Gaussian elimination, partial pivoting). */
function solveSmall(A: number[][], y: number[]): number[] | null {
	const m = y.length;
	for (let c = 0; c < m; c++) {
		let piv = c;
		for (let r = c + 1; r < m; r++) if (Math.abs(A[r][c]) > Math.abs(A[piv][c])) piv = r;
		if (Math.abs(A[piv][c]) < 1e-300) return null;
		[A[c], A[piv]] = [A[piv], A[c]];
		[y[c], y[piv]] = [y[piv], y[c]];
		for (let r = c + 1; r < m; r++) {
			const k = A[r][c] / A[c][c];
			for (let j = c; j < m; j++) A[r][j] -= k * A[c][j];
			y[r] -= k * y[c];
		}
	}
	const p = new Array<number>(m).fill(0);
	for (let r = m - 1; r >= 0; r--) {
		let v = y[r];
		for (let j = r + 1; j < m; j++) v -= A[r][j] * p[j];
		p[r] = v / A[r][r];
	}
	return p;
}

/** Sample ranges [from, to) of a record. */
type Ranges = readonly (readonly [number, number])[];

/**
 * Least-squares a·cos(ωi) + b·sin(ωi) + c + d·i over the samples in `ranges`: the line takes up
 * what the whole-record detrend left in the parts used (a drift the fit must not bend the tone's
 * phase to follow). Returns the sinusoid's a and b. The normal equations are summed with the
 * phasor turned by recurrence, without an array per sample.
 */
function fitSinusoid(
	x: Float64Array,
	fs: number,
	f: number,
	ranges: Ranges
): { a: number; b: number; explained: number } {
	const w = (2 * Math.PI * f) / fs;
	const cw = Math.cos(w);
	const sw = Math.sin(w);
	const n = x.length;
	// sums of the products of u = (cos, sin, 1, i/n) and of u with x
	let cc = 0,
		cs = 0,
		c1 = 0,
		ct = 0,
		ss = 0,
		s1 = 0,
		st = 0,
		n1 = 0,
		t1 = 0,
		tt = 0;
	let xc = 0,
		xs = 0,
		x1 = 0,
		xt = 0;
	for (const [from, to] of ranges) {
		let c = Math.cos(w * from);
		let s = Math.sin(w * from);
		for (let i = from; i < to; i++) {
			const t = i / n;
			const v = x[i];
			cc += c * c;
			cs += c * s;
			c1 += c;
			ct += c * t;
			ss += s * s;
			s1 += s;
			st += s * t;
			n1 += 1;
			t1 += t;
			tt += t * t;
			xc += v * c;
			xs += v * s;
			x1 += v;
			xt += v * t;
			const c2 = c * cw - s * sw;
			s = s * cw + c * sw;
			c = c2;
			if (((i - from) & 1023) === 1023) {
				const r = Math.sqrt(c * c + s * s);
				c /= r;
				s /= r;
			}
		}
	}
	const A = [
		[cc, cs, c1, ct],
		[cs, ss, s1, st],
		[c1, s1, n1, t1],
		[ct, st, t1, tt]
	];
	const y = [xc, xs, x1, xt];
	const rhs = [...y];
	const p = solveSmall(A, y);
	// the sum of squares the fit explains, pᵀy: what a frequency search must maximise
	return p
		? { a: p[0], b: p[1], explained: p.reduce((acc, v, r) => acc + v * rhs[r], 0) }
		: { a: 0, b: 0, explained: 0 };
}

interface Tone {
	frequencyHz: number;
	amplitude: number;
}

const TONE_SEGMENTS = 8;

/**
 * Steady tones: peaks that stand at the same level in each eighth of the record (a mode rings
 * down, and is absent before the hit). Frequencies are refined on the whole record by the
 * projection's maximum (golden-section search over one segment bin).
 */
function findTones(x: Float64Array, fs: number, fMax: number): number[] {
	const len = Math.floor(x.length / TONE_SEGMENTS);
	if (len < 256) return [];
	const T = x.length / fs;
	// no zero padding: a tone's line spans a Hann main lobe, and the ±1 bin below catches it
	const nfft = nextPow2(len);
	const hann = hannWindow(len, 'symmetric');
	const bins0 = nfft / 2 + 1;
	const kMax0 = Math.min(bins0 - 2, Math.floor((fMax / fs) * nfft));
	// a tone is in the first and the last eighth alike: when no line stands in both, there is
	// none, and the six spectra between are not needed (the common case, a stopped machine)
	const first = windowedAmplitude(x, 0, hann, nfft);
	const last = windowedAmplitude(x, (TONE_SEGMENTS - 1) * len, hann, nfft);
	const both = new Float64Array(bins0);
	for (let k = 1; k <= kMax0; k++)
		both[k] = Math.min(
			Math.max(first[k - 1], first[k], first[k + 1]),
			Math.max(last[k - 1], last[k], last[k + 1])
		);
	if (findPeaks(both, 4, kMax0, 8 * medianLevel(both, 4, kMax0), 2).length === 0) return [];
	const spectra = Array.from({ length: TONE_SEGMENTS }, (_, s) =>
		s === 0 ? first : s === TONE_SEGMENTS - 1 ? last : windowedAmplitude(x, s * len, hann, nfft)
	);
	// the segments the hit rings in (RMS well above the median segment's) leak its modes into
	// every bin nearby: the steadiness test leaves them out
	const segRms = Array.from({ length: TONE_SEGMENTS }, (_, s) => {
		let e = 0;
		for (let i = s * len; i < (s + 1) * len; i++) e += x[i] * x[i];
		return Math.sqrt(e / len);
	});
	const medianRms = [...segRms].sort((a, b) => a - b)[TONE_SEGMENTS / 2];
	const hitSegments = new Set(
		segRms.flatMap((r, i) => (r > 1.3 * medianRms ? [i] : [])).slice(0, TONE_SEGMENTS - 4)
	);
	const bins = spectra[0].length;
	const kMax = Math.min(bins - 2, Math.floor((fMax / fs) * nfft));
	// the lowest level across the segments, per bin (±1 bin: a tone's line may sit between bins)
	const low = new Float64Array(bins).fill(Infinity);
	low[0] = 0;
	low[bins - 1] = 0;
	for (const sp of spectra)
		for (let k = 1, end = Math.min(bins - 1, kMax + 2); k < end; k++) {
			let v = sp[k - 1] > sp[k] ? sp[k - 1] : sp[k];
			if (sp[k + 1] > v) v = sp[k + 1];
			if (v < low[k]) low[k] = v;
		}
	for (let k = Math.min(bins - 1, kMax + 2); k < bins; k++) low[k] = 0;
	const floor = medianLevel(low, 4, kMax);
	const df = fs / nfft;
	const tones: number[] = [];
	// the strongest lines first, none 60 dB below the strongest (a quantised record's spurs), at
	// most eight: each costs a fit over the whole record
	const lines = findPeaks(low, 4, kMax, 8 * floor, 2).sort((a, b) => low[b.bin] - low[a.bin]);
	const strongest = lines.length ? low[lines[0].bin] : 0;
	for (const p of lines.filter((q) => low[q.bin] >= 1e-3 * strongest).slice(0, 8)) {
		// steady: the highest segment no more than 1.5× the lowest, and no trend over the record
		const levels = spectra
			.filter((_, i) => !hitSegments.has(i))
			.map((sp) => Math.max(sp[p.bin - 1], sp[p.bin], sp[p.bin + 1]));
		const hi = Math.max(...levels);
		const lo = Math.min(...levels);
		const mid = Math.floor(levels.length / 2);
		const firstHalf = levels.slice(0, mid).reduce((a, b) => a + b, 0) / mid;
		const lastHalf = levels.slice(mid).reduce((a, b) => a + b, 0) / (levels.length - mid);
		if (lo <= 0 || hi / lo > 1.5 || Math.abs(Math.log(firstHalf / lastHalf)) > 0.2) continue;
		// under the Hann window the projection's main lobe is ±2/T wide: a grid of 1/T over ±2
		// segment bins lands in it, within half a step of the top, and golden section finds the top
		const step = 1 / T;
		let best = (p.bin - 2) * df;
		let bestP = -1;
		for (let f = Math.max(step, (p.bin - 2) * df); f <= (p.bin + 2) * df; f += step) {
			const pr = projection(x, fs, f);
			if (pr > bestP) [best, bestP] = [f, pr];
		}
		const f = goldenMax((f) => projection(x, fs, f), best - step, best + step, 1e-3 * step);
		tones.push(f);
	}
	return tones;
}

/** Golden-section search for the maximum of `g` on [a, b]. */
function goldenMax(g: (f: number) => number, a: number, b: number, tol: number): number {
	const r = (Math.sqrt(5) - 1) / 2;
	let c = b - r * (b - a);
	let d = a + r * (b - a);
	let gc = g(c);
	let gd = g(d);
	for (let i = 0; i < 40 && b - a > tol; i++) {
		if (gc > gd) {
			b = d;
			d = c;
			gd = gc;
			c = b - r * (b - a);
			gc = g(c);
		} else {
			a = c;
			c = d;
			gc = gd;
			d = a + r * (b - a);
			gd = g(d);
		}
	}
	return (a + b) / 2;
}

/**
 * x less the tones, fitted together by least squares on the samples `use` selects (backfitting:
 * each tone in turn against the record less the others, three rounds, which converges to the
 * joint fit, so neighbouring tones do not bias each other). With `refine`, each tone's frequency
 * is searched within ±`refine` Hz for the best fit: the part before the hit and the end of the
 * record are far apart, so the fit is sharp in frequency.
 */
function withoutTones(
	x: Float64Array,
	fs: number,
	frequencies: number[],
	use: Ranges,
	refine = 0
): { rest: Float64Array; tones: Tone[] } {
	if (frequencies.length === 0) return { rest: x, tones: [] };
	const rest = Float64Array.from(x);
	const fit = frequencies.map((f) => ({ f, a: 0, b: 0 }));
	const add = (t: { f: number; a: number; b: number }, sign: number) => {
		const p = new Phasor((2 * Math.PI * t.f) / fs);
		const a = sign * t.a;
		const b = sign * t.b;
		for (let i = 0; i < rest.length; i++) {
			rest[i] += a * p.c + b * p.s;
			p.step();
		}
	};
	for (let round = 0; round < (fit.length > 1 ? 3 : 1); round++)
		for (const t of fit) {
			add(t, +1); // the record less the other tones
			if (refine > 0) {
				const span = round === 0 ? refine : refine / 4;
				t.f = goldenMax(
					(f) => fitSinusoid(rest, fs, f, use).explained,
					t.f - span,
					t.f + span,
					1e-7 * t.f
				);
			}
			const { a, b } = fitSinusoid(rest, fs, t.f, use);
			Object.assign(t, { a, b });
			add(t, -1);
		}
	return { rest, tones: fit.map((t) => ({ frequencyHz: t.f, amplitude: Math.hypot(t.a, t.b) })) };
}

/**
 * The hit: the first window of ~1 ms whose RMS exceeds 8× (18 dB) the pre-hit level (the median
 * window before the loudest one), and at least a twentieth of the loudest; then the first sample
 * in the window before it or in it that stands 5× above the pre-hit RMS. A record that starts with
 * the hit has no quiet part before its loudest window: there the hit is the first sample above a
 * tenth of the largest (tones are already out, so a running machine cannot put it at sample 0).
 */
function findHit(x: Float64Array, fs: number): { hit: number; preRms: number } {
	const w = Math.max(8, Math.round(0.001 * fs));
	const e = rmsEnvelope(x, w);
	let loudest = 0;
	let at = 0;
	for (let k = 0; k < e.length; k++)
		if (e[k] > loudest) {
			loudest = e[k];
			at = k;
		}
	const before = e.slice(0, at).sort();
	const pre = before[Math.floor(before.length / 2)] ?? Infinity;
	if (before.length < 4 || pre > loudest / 8) {
		let max = 0;
		for (let i = 0; i < x.length; i++) max = Math.max(max, Math.abs(x[i]));
		let hit = 0;
		while (hit < x.length - 1 && Math.abs(x[hit]) < 0.1 * max) hit++;
		return { hit, preRms: before.length ? before[0] : 0 };
	}
	const threshold = Math.max(8 * pre, loudest / 20);
	let k = 0;
	while (k < at && e[k] <= threshold) k++;
	const from = Math.max(0, (k - 1) * w);
	let peak = 0;
	for (let i = from; i < Math.min(x.length, (k + 1) * w); i++)
		peak = Math.max(peak, Math.abs(x[i]));
	const level = Math.min(peak, Math.max(5 * Math.SQRT2 * pre, 0.1 * peak));
	let hit = from;
	while (hit < x.length - 1 && Math.abs(x[hit]) < level) hit++;
	return { hit, preRms: pre };
}

interface Segment {
	x: Float64Array;
	mag: Float64Array;
	fs: number;
	df: number;
	n: number;
	T: number;
	resolution: number;
	tauW: number | null;
	responseKind: ResponseKind;
}

/**
 * A heavily damped mode is gone in a few periods, too soon for an envelope. Its band (the peak ±
 * three half-power widths), back in the time domain, is fitted by the two-term linear prediction
 * x[i] = c₁x[i−1] + c₂x[i−2] that a damped sinusoid obeys exactly (Prony's method for one mode):
 * r = √(−c₂) = e^(−σ/fs), cos θ = c₁/(2r), θ = ω_d/fs. Fitted from the band's largest value down
 * to a hundredth of it. `quality` is the share of the band's energy the prediction explains.
 */
function pronyOneMode(x: Float64Array, fs: number, f: number, hpHz: [number, number]) {
	// the record itself first, when this mode is all it holds; else the mode's band
	const whole = prony(x, fs, f);
	if (whole && whole.quality >= 0.99 && Math.abs(whole.fd - f) < hpHz[1] - hpHz[0]) return whole;
	const n = x.length;
	const nfft = 2 * nextPow2(n);
	const df = fs / nfft;
	const half = Math.min(3 * (hpHz[1] - hpHz[0]), 0.9 * f);
	const { re } = analyticBand(
		realFft(x, nfft),
		Math.floor((f - half) / df),
		Math.ceil((f + half) / df),
		n
	);
	return prony(re, fs, f);
}

function prony(re: Float64Array, fs: number, f: number) {
	const n = re.length;
	let peak = 0;
	let at = 0;
	for (let i = 0; i < n; i++) if (Math.abs(re[i]) > peak) [peak, at] = [Math.abs(re[i]), i];
	let to = at;
	let quiet = 0;
	// the end: a full period below a hundredth of the peak
	const period = Math.max(2, Math.round(fs / f));
	while (to < n && quiet < period) {
		quiet = Math.abs(re[to]) < 0.01 * peak ? quiet + 1 : 0;
		to++;
	}
	let a11 = 0;
	let a12 = 0;
	let a22 = 0;
	let b1 = 0;
	let b2 = 0;
	let e = 0;
	for (let i = Math.max(2, at); i < to; i++) {
		a11 += re[i - 1] * re[i - 1];
		a12 += re[i - 1] * re[i - 2];
		a22 += re[i - 2] * re[i - 2];
		b1 += re[i] * re[i - 1];
		b2 += re[i] * re[i - 2];
		e += re[i] * re[i];
	}
	const det = a11 * a22 - a12 * a12;
	if (to - at < 8 || det <= 0 || e <= 0) return null;
	const c1 = (b1 * a22 - b2 * a12) / det;
	const c2 = (b2 * a11 - b1 * a12) / det;
	if (c2 >= 0) return null;
	const r = Math.sqrt(-c2);
	const cos = c1 / (2 * r);
	if (r >= 1 || Math.abs(cos) >= 1) return null;
	const sigma = -Math.log(r) * fs;
	const fd = (Math.acos(cos) * fs) / (2 * Math.PI);
	const quality = (c1 * b1 + c2 * b2) / e;
	return { sigma, fd, quality };
}

/** The peak's interpolated height and frequency, and its half-power band and damping. */
function halfPowerOf(seg: Segment, bin: number) {
	const { mag, df, tauW, responseKind } = seg;
	const ip = interpolatePeak(mag, bin);
	const fPeak = ip.bin * df;
	const hp = halfPowerBins(mag, bin, ip.height);
	const hpHz: [number, number] | null =
		hp && hp[0] > 0 && hp[1] > hp[0] && Number.isFinite(hp[1]) ? [hp[0] * df, hp[1] * df] : null;
	const windowDamping = tauW === null ? 0 : 1 / (2 * Math.PI * fPeak * tauW);
	// exact for the quantity measured (ζ ≈ Δf/2f reads 5 % high at ζ = 0.15 and 26 % at 0.3)
	const hpRaw = hpHz
		? Math.max(0, halfPowerExact(hpHz[0], hpHz[1], responseKind).dampingRatio - windowDamping)
		: null;
	return { height: ip.height, fPeak, hpHz, hpRaw };
}

/**
 * The mode's decay: its envelope by demodulation at the peak, fitted on a log scale over the part
 * that rings down, or (heavily damped, a poor envelope) Prony's one-mode fit of its band.
 */
function decayOf(
	seg: Segment,
	fPeak: number,
	hpHz: [number, number] | null,
	hpRaw: number | null,
	nearest: number
) {
	const { x, fs, n } = seg;
	// envelope and phase by demodulation, rejecting the nearest neighbour and the 2f image;
	// the low-pass must also follow the decay: a heavily damped mode is gone in a few periods
	const sigmaHp = hpHz ? Math.PI * (hpHz[1] - hpHz[0]) : 0;
	const L = Math.min(
		Math.floor(n / 8),
		sigmaHp > 0 ? Math.max(8, Math.ceil(fs / (2 * sigmaHp))) : Infinity,
		Math.max(8, Math.ceil((2 * fs) / Math.min(nearest, fPeak)))
	);
	// only until the mode has rung down: ten time constants by the half-power estimate
	const span = hpHz
		? Math.min(n, Math.ceil((fs * 10) / (Math.PI * (hpHz[1] - hpHz[0]))) + 8 * L)
		: n;
	const { env, re, im, step } = demodulatedEnvelope(
		span < n ? x.subarray(0, span) : x,
		fs,
		fPeak,
		L
	);
	const m = env.length;
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
	const prony =
		hpRaw !== null && hpRaw > 0.05 && (fit === null || fit.r2 < 0.95)
			? pronyOneMode(x, fs, fPeak, hpHz as [number, number])
			: null;
	const useProny = prony !== null && prony.quality >= 0.95;
	const sigma = useProny ? prony.sigma : fit ? -fit.slope : null;
	const cleanFit =
		useProny || (fit !== null && fit.r2 >= 0.95 && fit.points >= 8 && sigma !== null && sigma > 0);
	// demodulated at the peak, the phase turns at f_d − f_peak
	const phaseFd = () => {
		const slope = cleanFit && !useProny ? phaseSlope(re, im, fs, from, to, step) : null;
		return useProny ? prony.fd : slope !== null ? fPeak + slope / (2 * Math.PI) : fPeak;
	};
	return { sigma, cleanFit, dampedHz: phaseFd };
}

/** Characterises one spectral peak: a mode (with its flags), or null when it does not ring down. */
function characterise(
	seg: Segment,
	p: { bin: number; prominence: number },
	neighbours: number[],
	tones: Tone[],
	tallest: number,
	recordFlags: ModeFlag[],
	disagreement: number
): RingdownMode | 'steady' | 'residue' {
	const { fs, n, T, resolution, tauW } = seg;
	const { height, fPeak, hpHz, hpRaw } = halfPowerOf(seg, p.bin);
	const nearest = neighbours.length
		? Math.min(...neighbours.map((f) => Math.abs(f - fPeak)))
		: Infinity;
	const { sigma, cleanFit, dampedHz } = decayOf(seg, fPeak, hpHz, hpRaw, nearest);
	// a line that does not ring down (a tone the segment test could not see: a short record)
	const steady =
		(sigma === null || sigma * T < 0.2) && (hpHz === null || hpHz[1] - hpHz[0] < 3 * resolution);
	if (steady) return 'steady';
	// what is left of a subtracted tone (its speed wanders a little): poorly fitted, at the tone,
	// and a small fraction of it
	const residue = tones.some(
		(t) => Math.abs(t.frequencyHz - fPeak) < 4 * resolution && (2 * height) / n < 0.05 * t.amplitude
	);
	if (residue && !cleanFit) return 'residue';
	const fd = dampedHz();
	const decayDamping = cleanFit
		? (sigma as number) / Math.hypot(sigma as number, 2 * Math.PI * fd)
		: null;
	const fn = cleanFit ? Math.hypot(fd, (sigma as number) / (2 * Math.PI)) : fPeak;
	const halfPowerValid = hpRaw !== null && hpRaw <= HALF_POWER_LIMIT;
	const zeta =
		decayDamping !== null && decayDamping > 0 ? decayDamping : halfPowerValid ? hpRaw : null;
	const flags: ModeFlag[] = [...recordFlags];
	if (hpHz && hpHz[1] - hpHz[0] < 2 * resolution) flags.push('coarse-resolution');
	const w = 2 * Math.PI * fn;
	if (zeta !== null && zeta > 0 && T < 6 / (zeta * w)) flags.push('short-record');
	if (!cleanFit) flags.push('poor-envelope-fit');
	if (hpRaw !== null && !halfPowerValid) flags.push('half-power-invalid');
	if (zeta !== null && zeta > HEAVY_DAMPING) flags.push('heavy-damping');
	const band = hpHz ? hpHz[1] - hpHz[0] : 2 * resolution;
	if (nearest < Math.max(4 * resolution, 3 * band)) flags.push('close-mode');
	if (tones.some((t) => Math.abs(t.frequencyHz - fPeak) < Math.max(3 * resolution, 2 * band)))
		flags.push('tone-nearby');
	if (
		halfPowerValid &&
		decayDamping !== null &&
		Math.abs((hpRaw as number) - decayDamping) / Math.max(hpRaw as number, decayDamping) >
			disagreement
	)
		flags.push('damping-disagreement');
	// one amplitude: B = 2|X|·(1 − e^(−σ'/fs)) / (1 − e^(−σ'T)), σ' the decay of the analysed
	// (windowed) record; → 2|X|/n as σ' → 0
	const sigmaW = (zeta !== null ? zeta * w : 0) + (tauW === null ? 0 : 1 / tauW);
	const amplitude =
		sigmaW > 0
			? (2 * height * -Math.expm1(-sigmaW / fs)) / -Math.expm1(-sigmaW * T)
			: (2 * height) / n;
	return {
		frequencyHz: fn,
		dampedFrequencyHz: zeta !== null ? fn * Math.sqrt(Math.max(0, 1 - zeta * zeta)) : fd,
		frequencySource: cleanFit ? 'decay-fit' : 'spectral-peak',
		dampingRatio: zeta !== null && zeta > 0 ? zeta : null,
		qFactor: zeta !== null && zeta > 0 ? 1 / (2 * zeta) : null,
		amplitude,
		halfPowerDamping: hpRaw,
		decayDamping,
		halfPowerHz: hpHz,
		prominence: p.prominence / tallest,
		hits: 1,
		frequencySpreadHz: 0,
		flags
	};
}

/** Mean and trend removed, clipping seen, tones found and subtracted, the hit located. */
function prepare(
	samples: ArrayLike<number>,
	fs: number,
	fMax: number,
	detrended: Float64Array | null = null
) {
	const clipped = isClipped(samples);
	const x0 = detrended ?? detrend(samples);
	let max = 0;
	for (let i = 0; i < x0.length; i++) max = Math.max(max, Math.abs(x0[i]));
	if (max === 0)
		throw new VibrationInputError(
			'samples',
			'a signal that is not constant (this recording is flat)',
			'flat'
		);
	const toneHz = findTones(x0, fs, fMax);
	// first pass: tones fitted on the last quarter of the record (a ring-down record lets the modes
	// die out), to find the hit under them; second pass: fitted where the modes are absent, before
	// the hit and in the last quarter, which pins their frequency over the whole record
	const tail = Math.floor(0.75 * x0.length);
	const refine = 0.5 / (x0.length / fs); // half a resolution step of the whole record
	// on a long record, half a segment's worth at each end is fit enough: far apart, they pin the
	// frequency
	const part = MAX_SEGMENT >> 1;
	const end = x0.length;
	let { rest, tones } = withoutTones(x0, fs, toneHz, [[Math.max(tail, end - part), end]], refine);
	let { hit, preRms } = findHit(rest, fs);
	if (toneHz.length) {
		const before = Math.max(0, Math.min(tail, hit - Math.round(0.002 * fs)));
		const quiet: Ranges = [
			[Math.max(0, before - part), before],
			[Math.max(tail, end - part), end]
		];
		({ rest, tones } = withoutTones(x0, fs, toneHz, quiet, refine));
		({ hit, preRms } = findHit(rest, fs));
	}
	return { clipped, x0, rest, tones, hit, preRms };
}

/**
 * The modes of a ring-down recording, strongest first. `samples` in any unit (g, m/s², mm/s …);
 * amplitudes come back in the same unit. A record of several hits (a technician's usual five) is
 * cut at each hit; each hit is analysed on its own and the modes found are combined: the median
 * frequency, damping and amplitude of each, how many hits showed it and its spread across them.
 */
export function analyzeRingdown(
	samples: ArrayLike<number>,
	sampleRateHz: number,
	options: RingdownOptions = {}
): RingdownResult {
	validateSamples(samples);
	const fs = positive('sampleRateHz', sampleRateHz);
	const opt = settle(options, fs);
	const x0 = detrend(samples);
	const onsets = findOnsets(x0, fs);
	if (onsets.length >= 2) return severalHits(samples, x0, fs, onsets, opt, []);
	return oneHit(samples, fs, opt, true, x0);
}

type Settled = ReturnType<typeof settle>;

function settle(options: RingdownOptions, fs: number) {
	const opt = { ...DEFAULTS, ...options };
	return {
		...opt,
		maxModes: integerAtLeast('maxModes', opt.maxModes, 1),
		minProm: positive('minProminence', opt.minProminence),
		noiseFactor: positive('noiseFactor', opt.noiseFactor),
		tauW:
			opt.exponentialWindowS === null || opt.exponentialWindowS === undefined
				? null
				: positive('exponentialWindowS', opt.exponentialWindowS),
		progress: opt.onProgress ?? (() => {}),
		responseKind: opt.responseKind ?? ('acceleration' as ResponseKind),
		fMaxAsked: Math.min(opt.maxFrequencyHz ?? Infinity, 0.45 * fs)
	};
}

/**
 * Separate hits in a record: jumps of 8× in mean square (9 dB in amplitude) over the 100 ms
 * before, reaching a hundredth of the loudest window (a tenth in amplitude), at least half a
 * second after the last hit and once its ring-down has fallen below a tenth of its peak in
 * amplitude. A strike sooner than that, or onto a ringing structure, is a double hit of the same
 * segment (flagged). A record that opens with its hit counts that hit at sample 0. Returns sample
 * indices.
 */
function findOnsets(x: Float64Array, fs: number): number[] {
	// the loudest of a window and the two after it: a low mode takes a few milliseconds to swing
	// to full amplitude, and over a running tone the first window alone may rise less than 12 dB
	const { w, e, loudest, jumps } = energyJumps(x, fs, 8, 1 / 100, 2);
	if (e.length < 40) return [];
	const gap = Math.ceil(0.5 / (w / fs));
	const usual = quantile(e, 0.5);
	const onsets: number[] = [];
	let last = -Infinity;
	let from = 0; // where the current hit's segment began
	for (const b of jumps) {
		if (b - last < gap) continue;
		let peak = 0;
		for (let k = from; k < b; k++) peak = Math.max(peak, e[k]);
		let pre = 0;
		for (let k = b - 10; k < b; k++) pre += e[k] / 10;
		// onto a structure still ringing from a hit before it (one at the record's start included):
		// rung down means 20 dB below its peak, or down near the record's usual level (a running
		// tone's, in a record of hits that each ring down)
		if (peak > loudest / 100 && pre > Math.max(peak / 100, 2 * usual)) continue;
		onsets.push(b);
		last = b;
		from = b;
	}
	// a loud stretch before the first jump: the record opens with a hit
	let before = 0;
	for (let k = 0; k < (onsets[0] ?? 0); k++) before = Math.max(before, e[k]);
	if (onsets.length && before > loudest / 100) onsets.unshift(0);
	return onsets.map((b) => b * w);
}

/** Each hit of a record analysed on its own (from shortly before it to shortly before the next). */
function severalHits(
	samples: ArrayLike<number>,
	x0: Float64Array,
	fs: number,
	onsets: number[],
	opt: Settled,
	tones: Tone[]
): RingdownResult {
	const starts = onsets.map((o, i) => {
		const spacing = i > 0 ? o - onsets[i - 1] : (onsets[1] ?? x0.length) - o;
		return Math.max(0, o - Math.min(Math.round(0.25 * spacing), Math.round(0.5 * fs)));
	});
	const results: RingdownResult[] = [];
	const offsets: number[] = [];
	starts.forEach((start, i) => {
		const end = Math.min(starts[i + 1] ?? x0.length, start + MAX_SEGMENT);
		if (end - start < 64) return;
		const part = x0.subarray(start, end);
		try {
			const r = oneHit(
				part,
				fs,
				{
					...opt,
					progress: (f) => opt.progress((i + f) / starts.length)
				},
				false
			);
			results.push(r);
			offsets.push(start);
		} catch (e) {
			// a segment without a ring-down (flat, or too short after its hit) adds nothing
			if (!(e instanceof VibrationInputError)) throw e;
		}
	});
	if (results.length === 0) return oneHit(samples, fs, opt, false);
	const combined = combineHits(results, opt.maxModes);
	const first = results[0];
	return {
		...first,
		modes: combined,
		tones: (tones.length ? tones : first.tones).slice(),
		preHitRms: medianOf(results.map((r) => r.preHitRms)) ?? first.preHitRms,
		samples: samples.length,
		durationS: samples.length / fs,
		hitIndex: offsets[0] + first.hitIndex,
		hitIndices: results.map((r, i) => offsets[i] + r.hitIndex),
		flags: majorityFlags(
			results.map((r) => r.flags),
			results.length
		),
		waveform: waveformChart(x0, fs)
	};
}

/** The q-quantile of xs, from at most 4,096 evenly spaced values. */
function quantile(xs: Float64Array, q: number): number {
	const take = Math.min(xs.length, 4096);
	if (take === 0) return 0;
	const pick = new Float64Array(take);
	for (let i = 0; i < take; i++) pick[i] = xs[Math.floor((i * xs.length) / take)];
	pick.sort();
	return pick[Math.min(take - 1, Math.floor(q * take))];
}

function medianOf(xs: number[]): number | null {
	if (xs.length === 0) return null;
	const s = [...xs].sort((a, b) => a - b);
	const h = s.length >> 1;
	return s.length % 2 ? s[h] : (s[h - 1] + s[h]) / 2;
}

/** Flags raised in at least half of `lists`; clipping in any. */
function majorityFlags(lists: ModeFlag[][], of: number): ModeFlag[] {
	const count = new Map<ModeFlag, number>();
	for (const l of lists) for (const f of new Set(l)) count.set(f, (count.get(f) ?? 0) + 1);
	return [...count].filter(([f, c]) => 2 * c >= of || f === 'clipping').map(([f]) => f);
}

/**
 * The modes of several hits, matched by frequency (within the hit's resolution, or 0.3 %) and
 * combined by the median; a mode that fewer than half of the hits showed is flagged, and listed
 * after those the hits agree on.
 */
function combineHits(results: RingdownResult[], maxModes: number): RingdownMode[] {
	const all = results
		.flatMap((r, h) =>
			r.modes.map((m) => ({ m, h, tol: Math.max(r.resolutionHz, 0.003 * m.frequencyHz) }))
		)
		.sort((a, b) => a.m.frequencyHz - b.m.frequencyHz);
	const groups: (typeof all)[] = [];
	for (const item of all) {
		const g = groups.at(-1);
		const centre = g ? (medianOf(g.map((i) => i.m.frequencyHz)) as number) : NaN;
		if (g && Math.abs(item.m.frequencyHz - centre) <= item.tol && !g.some((i) => i.h === item.h))
			g.push(item);
		else groups.push([item]);
	}
	const hits = results.length;
	const med = (g: typeof all, pick: (m: RingdownMode) => number | null) =>
		medianOf(g.map((i) => pick(i.m)).filter((v): v is number => v !== null));
	const modes = groups.map((g): RingdownMode => {
		const fs = g.map((i) => i.m.frequencyHz);
		const centre = g.slice().sort((a, b) => a.m.frequencyHz - b.m.frequencyHz)[
			(g.length - 1) >> 1
		].m;
		const zeta = med(g, (m) => m.dampingRatio);
		const flags = majorityFlags(
			g.map((i) => i.m.flags),
			g.length
		);
		if (2 * g.length < hits) flags.push('not-repeatable');
		return {
			...centre,
			frequencyHz: medianOf(fs) as number,
			dampedFrequencyHz: med(g, (m) => m.dampedFrequencyHz) as number,
			dampingRatio: zeta,
			qFactor: zeta !== null ? 1 / (2 * zeta) : null,
			amplitude: med(g, (m) => m.amplitude) as number,
			halfPowerDamping: med(g, (m) => m.halfPowerDamping),
			decayDamping: med(g, (m) => m.decayDamping),
			prominence: med(g, (m) => m.prominence) as number,
			hits: g.length,
			frequencySpreadHz: Math.max(...fs) - Math.min(...fs),
			flags
		};
	});
	const repeatable = (m: RingdownMode) => (m.flags.includes('not-repeatable') ? 1 : 0);
	return modes
		.sort((a, b) => repeatable(a) - repeatable(b) || b.amplitude - a.amplitude)
		.slice(0, maxModes);
}

/** One hit's analysis (the record holds one hit, or is a segment around one). */
function oneHit(
	samples: ArrayLike<number>,
	fs: number,
	opt: Settled,
	maySplit: boolean,
	detrended: Float64Array | null = null
): RingdownResult {
	const { maxModes, minProm, noiseFactor, tauW, progress, fMaxAsked } = opt;
	const { clipped, x0, rest, tones, hit, preRms } = prepare(samples, fs, fMaxAsked, detrended);
	// hits a strong tone hid: once the tones are out, the record may show several
	if (maySplit && tones.length) {
		const onsets = findOnsets(rest, fs);
		if (onsets.length >= 2) return severalHits(samples, rest, fs, onsets, opt, tones);
	}
	progress(0.2);
	const start = Math.max(0, hit - Math.round(0.002 * fs));
	const x = rest.subarray(start, Math.min(rest.length, start + MAX_SEGMENT));
	const n = x.length;
	if (n < 64) throw new VibrationInputError('samples', 'at least 64 samples after the hit', n);
	const recordFlags: ModeFlag[] = [
		...(clipped ? (['clipping'] as const) : []),
		...(hasSecondHit(x, fs) ? (['double-hit'] as const) : [])
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
	const mag = magnitudeSpectrum(windowed, nfft);
	const backgroundSegments = opt.background
		? subtractBackground(mag, opt.background, n, nfft, tauW, fs)
		: 0;
	progress(0.45);
	const df = fs / nfft;
	const T = n / fs;
	const resolution = 1 / T;
	const kMin = Math.ceil(Math.max(opt.minFrequencyHz ?? 0, 2 * resolution) / df);
	const kMax = Math.min(mag.length - 1, Math.floor(fMaxAsked / df));
	const seg: Segment = { x, mag, fs, df, n, T, resolution, tauW, responseKind: opt.responseKind };
	const candidates = peakCandidates(
		mag,
		kMin,
		kMax,
		minProm,
		noiseFactor,
		resolution,
		df,
		maxModes
	);

	const modes: RingdownMode[] = [];
	const steadyTones: Tone[] = [...tones];
	candidates.list.forEach((p, idx) => {
		progress(0.45 + (0.5 * idx) / Math.max(1, candidates.list.length));
		const neighbours = candidates.list.filter((q) => q !== p).map((q) => q.bin * df);
		const got = characterise(
			seg,
			p,
			neighbours,
			tones,
			candidates.tallest,
			recordFlags,
			opt.disagreement
		);
		if (got === 'residue') return;
		if (got === 'steady')
			steadyTones.push({ frequencyHz: p.bin * df, amplitude: (2 * p.height) / n });
		else if (modes.length < maxModes) modes.push(got);
	});
	modes.sort((a, b) => b.amplitude - a.amplitude);
	progress(1);
	return {
		modes,
		tones: steadyTones.sort((a, b) => a.frequencyHz - b.frequencyHz),
		preHitRms: preRms,
		sampleRateHz: fs,
		samples: samples.length,
		durationS: samples.length / fs,
		resolutionHz: resolution,
		nfft,
		hitIndex: hit,
		hitIndices: [hit],
		backgroundSegments,
		flags: recordFlags,
		spectrum: spectrumChart(mag, fs, df, n, fMaxAsked),
		waveform: waveformChart(x0, fs)
	};
}

/**
 * Peaks of the hit's spectrum, most prominent first: above `noiseFactor` × the median magnitude
 * in the band (the noise floor; tones are already out) and `minProminence` × the tallest, and at
 * least two resolution steps from a more prominent one.
 */
function peakCandidates(
	mag: Float64Array,
	kMin: number,
	kMax: number,
	minProm: number,
	noiseFactor: number,
	resolution: number,
	df: number,
	maxModes: number
) {
	let tallest = 0;
	for (let k = kMin; k <= kMax; k++) tallest = Math.max(tallest, mag[k]);
	const floor = medianLevel(mag, kMin, kMax + 1);
	const least = Math.max(tallest * minProm, noiseFactor * floor);
	const peaks = findPeaks(mag, kMin, kMax, least, Math.round((2 * resolution) / df))
		.filter((p) => p.prominence >= least)
		.sort((a, b) => b.prominence - a.prominence);
	const kept: typeof peaks = [];
	for (const p of peaks) {
		if (kept.length >= maxModes + 2) break; // most prominent first: the rest cannot enter
		if (kept.every((q) => Math.abs(q.bin - p.bin) * df >= 2 * resolution)) kept.push(p);
	}
	return { list: kept, tallest };
}

/**
 * Spectral subtraction, in place: |X|² less twice the mean |B|² of the background record cut in
 * stretches of the hit's length n (windowed as the hit is, up to 16 stretches; a shorter record is
 * used whole and its power scaled to n), floored 60 dB below the tallest bin. Returns the
 * stretches averaged.
 */
function subtractBackground(
	mag: Float64Array,
	background: ArrayLike<number>,
	n: number,
	nfft: number,
	tauW: number | null,
	fs: number
): number {
	validateSamples(background);
	const b = detrend(background);
	const len = Math.min(n, b.length);
	const count = Math.max(1, Math.min(16, Math.floor(b.length / len)));
	const power = new Float64Array(mag.length);
	const seg = new Float64Array(len);
	for (let k = 0; k < count; k++) {
		for (let i = 0; i < len; i++)
			seg[i] = b[k * len + i] * (tauW === null ? 1 : Math.exp(-i / fs / tauW));
		const m = magnitudeSpectrum(seg, nfft);
		for (let j = 0; j < mag.length; j++) power[j] += (m[j] * m[j]) / count;
	}
	// a stationary record's power grows with its length; twice the mean is taken off, since one
	// record's power scatters about its mean (over-subtraction, common practice in spectral
	// subtraction)
	const scale = (2 * n) / len;
	// floored 60 dB under the tallest bin, not at zero (peak interpolation takes logarithms), and
	// not under each bin's own level, which would keep a fully subtracted spectrum's shape
	let tallest = 0;
	for (let j = 0; j < mag.length; j++) tallest = Math.max(tallest, mag[j]);
	const floor = 1e-6 * tallest * tallest;
	for (let j = 0; j < mag.length; j++)
		mag[j] = Math.sqrt(Math.max(floor, mag[j] * mag[j] - scale * power[j]));
	return count;
}

/** Chart data, decimated without building full-length arrays: the spectrum (≤ 2048 points). */
function spectrumChart(
	mag: Float64Array,
	fs: number,
	df: number,
	n: number,
	fMax: number
): RingdownResult['spectrum'] {
	const scale = 2 / n;
	const kEnd = Math.min(mag.length, Math.ceil(Math.min(fMax, 0.5 * fs) / df) + 1);
	const spectrum = bucketMax(
		kEnd,
		2048,
		(k) => mag[k] * scale,
		(k) => k * df
	);
	return { frequencyHz: spectrum.x, magnitude: spectrum.y };
}

/** The whole record's waveform with its RMS envelope (≤ 2000 points). */
function waveformChart(x0: Float64Array, fs: number): RingdownResult['waveform'] {
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
	return { timeS: wave.x, value: wave.y, envelope };
}

/** A finite check of a sample rate given by a person (CSV without a time column, WAV header). */
export function validSampleRate(value: unknown): number {
	const v = finite('sample rate (Hz)', value);
	if (v <= 0) throw new VibrationInputError('sample rate (Hz)', 'greater than zero', v);
	return v;
}
