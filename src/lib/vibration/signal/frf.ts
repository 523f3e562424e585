/**
 * Two-channel impact test (instrumented hammer + response): hit detection, double-hit rejection,
 * the H1 frequency response function averaged over the accepted hits, and the ordinary coherence
 * (Ewins, Modal Testing §3; Brown, Allemang & Phillips, IMAC 2015 on double hits and overloads).
 *   H1(f) = Σ conj(F)·X / Σ |F|²,   γ²(f) = |Σ conj(F)·X|² / (Σ|F|² · Σ|X|²)
 *   H2(f) = Σ|X|² / Σ F·conj(X)   (the two bracket the true FRF: H1 low under response noise,
 *   H2 high under force noise; ISO 7626-5 for impact excitation)
 * A force window keeps the pulse and zeroes the force record after it. An exponential window,
 * when asked for, starts at the trigger and weighs force and response alike, so |H| is not scaled
 * by the pre-trigger; its added damping Δζ = 1/(ω·τ_w) is subtracted from the modes. The usable
 * band ends where the force spectrum has fallen `forceDropDb` (default 10 dB) below its level at
 * the low end: above it the hammer put in too little to measure, and no peak there is a mode.
 * Coherence is 1 by definition with a single hit: it is reported only from three averages on.
 */
import { positive, VibrationInputError, integerAtLeast } from '../errors.ts';
import { bucketMax, realFft } from './spectrum.ts';
import { findPeaks, halfPowerBins, interpolatePeak } from './peaks.ts';
import { halfPowerExact, type ResponseKind } from '../damping.ts';

export interface Hit {
	/** first sample of the pulse above the trigger */
	index: number;
	/** pulse length, samples */
	width: number;
	accepted: boolean;
	reason: string | null;
}

export interface FrfMode {
	frequencyHz: number;
	dampingRatio: number | null;
	qFactor: number | null;
	/** |H1| at the peak (response unit per force unit) */
	amplitude: number;
	/** |H2| at the same frequency; above |H1| by the noise on the force */
	h2Amplitude: number;
	/** ordinary coherence at the peak; null below three averages, where it means nothing */
	coherence: number | null;
	flags: ('low-coherence' | 'coarse-resolution')[];
}

/** Averages below which coherence is not reported. */
export const MIN_COHERENCE_AVERAGES = 3;

export interface ImpactResult {
	hits: Hit[];
	averages: number;
	resolutionHz: number;
	/** the band the hammer excited: up to where its spectrum fell by forceDropDb */
	usableBandHz: [number, number];
	modes: FrfMode[];
	/** for charts (≤ 2048 points) */
	frf: { frequencyHz: number[]; magnitude: number[]; coherence: number[] };
}

export interface ImpactOptions {
	/** trigger level as a fraction of the largest force (default 0.1) */
	trigger?: number;
	/** pre-trigger as a fraction of the segment (default 0.05) */
	preTrigger?: number;
	exponentialWindowS?: number | null;
	/** the fall of the force spectrum, dB below its low-frequency level, that ends the band (default 10) */
	forceDropDb?: number;
	/** what the response channel measures (default acceleration: the FRF is an accelerance) */
	responseKind?: ResponseKind;
	maxModes?: number;
	minProminence?: number;
	maxFrequencyHz?: number;
	onProgress?: (fraction: number) => void;
}

/** Pulses where |force| exceeds the trigger; a pulse closer to the previous one than `doubleWindow` samples marks a double hit. */
export function detectHits(force: ArrayLike<number>, trigger: number, doubleWindow: number): Hit[] {
	let max = 0;
	for (let i = 0; i < force.length; i++) max = Math.max(max, Math.abs(force[i]));
	if (max === 0) return [];
	const level = trigger * max;
	const pulses: { index: number; width: number }[] = [];
	for (let i = 0; i < force.length; i++) {
		if (Math.abs(force[i]) < level) continue;
		const start = i;
		while (i < force.length && Math.abs(force[i]) >= level) i++;
		pulses.push({ index: start, width: i - start });
	}
	const hits: Hit[] = pulses.map((p) => ({ ...p, accepted: true, reason: null }));
	for (let i = 1; i < hits.length; i++) {
		if (hits[i].index - hits[i - 1].index < doubleWindow) {
			hits[i - 1].accepted = false;
			hits[i - 1].reason = 'double hit';
			hits[i].accepted = false;
			hits[i].reason = 'double hit (second strike)';
		}
	}
	return hits;
}

/** Both channels as long as each other, with at least 64 finite samples. */
function checkChannels(force: ArrayLike<number>, response: ArrayLike<number>) {
	integerAtLeast('number of samples', force.length, 64);
	if (response.length !== force.length)
		throw new VibrationInputError(
			'response channel',
			`as long as the force channel (${force.length} samples)`,
			response.length
		);
	for (let i = 0; i < force.length; i++) {
		if (!Number.isFinite(force[i]))
			throw new VibrationInputError(`force[${i}]`, 'a finite number', force[i]);
		if (!Number.isFinite(response[i]))
			throw new VibrationInputError(`response[${i}]`, 'a finite number', response[i]);
	}
}

/**
 * The hits, double hits told apart, and the segment each accepted hit is analysed over: a power of
 * two no longer than the spacing of hits nor the time until the next one.
 */
function hitsAndSegment(force: ArrayLike<number>, trigger: number) {
	// provisional hits to size the segments: each hit gets the time until the next one
	const provisional = detectHits(force, trigger, 1);
	if (provisional.length === 0)
		throw new VibrationInputError(
			'force channel',
			'a recording with at least one hammer hit (it is flat)',
			'flat'
		);
	const starts = provisional.map((h) => h.index);
	const spacing =
		starts.length > 1
			? Math.min(...starts.slice(1).map((s, i) => s - starts[i]))
			: force.length - starts[0];
	// strikes closer than a tenth of the usual spacing (or 20 pulse widths) are one double hit
	const widest = Math.max(...provisional.map((h) => h.width));
	const gaps = starts.slice(1).map((s, i) => s - starts[i]);
	const typical = gaps.length
		? gaps.sort((a, b) => a - b)[Math.floor(gaps.length / 2)]
		: force.length;
	const hits = detectHits(force, trigger, Math.max(20 * widest, Math.floor(typical / 10)));
	const accepted = hits.filter((h) => h.accepted);
	if (accepted.length === 0)
		throw new VibrationInputError(
			'force channel',
			'at least one clean hit (every hit was a double hit)',
			hits.length
		);
	const usable =
		hits.length > 1
			? Math.max(64, Math.min(...accepted.map((h) => nextHitGap(h, hits, force.length))))
			: force.length - accepted[0].index;
	let seg = 1;
	while (seg * 2 <= Math.max(64, Math.min(spacing, usable))) seg *= 2;
	return { hits, accepted, seg };
}

/**
 * The auto- and cross-spectra summed over the accepted hits: force window on the force, an
 * exponential window from the trigger on both channels when asked. A hit too near the end for a
 * full segment is set aside, with the reason.
 */
function averagedSpectra(
	force: ArrayLike<number>,
	response: ArrayLike<number>,
	fs: number,
	accepted: Hit[],
	seg: number,
	pre: number,
	tauW: number | null,
	progress: (fraction: number) => void
) {
	const nfft = seg * 2;
	const half = nfft / 2;
	const gff = new Float64Array(half + 1);
	const gxx = new Float64Array(half + 1);
	const gre = new Float64Array(half + 1);
	const gim = new Float64Array(half + 1);
	let averages = 0;
	for (const h of accepted) {
		const s0 = Math.max(0, h.index - pre);
		if (s0 + seg > force.length) {
			h.accepted = false;
			h.reason = 'too close to the end of the recording';
			continue;
		}
		const f = new Float64Array(seg);
		const x = new Float64Array(seg);
		const trig = h.index - s0;
		const pulseEnd = trig + h.width * 3;
		for (let i = 0; i < seg; i++) {
			// exponential window from the trigger, on both channels
			const w = tauW && i > trig ? Math.exp(-(i - trig) / fs / tauW) : 1;
			f[i] = i <= pulseEnd ? force[s0 + i] * w : 0; // force window
			x[i] = response[s0 + i] * w;
		}
		const F = realFft(f, nfft);
		const X = realFft(x, nfft);
		for (let k = 0; k <= half; k++) {
			gff[k] += F.re[k] ** 2 + F.im[k] ** 2;
			gxx[k] += X.re[k] ** 2 + X.im[k] ** 2;
			// conj(F)·X
			gre[k] += F.re[k] * X.re[k] + F.im[k] * X.im[k];
			gim[k] += F.re[k] * X.im[k] - F.im[k] * X.re[k];
		}
		averages++;
		progress(averages / accepted.length / 2);
	}
	if (averages === 0)
		throw new VibrationInputError('force channel', 'a hit with a full segment after it', 0);
	return { gff, gxx, gre, gim, averages, nfft };
}

/** |H1| = |G_fx|/G_ff, |H2| = G_xx/|G_fx| and the coherence γ² = |G_fx|²/(G_ff·G_xx), per bin. */
function frfOf({ gff, gxx, gre, gim }: ReturnType<typeof averagedSpectra>) {
	const n = gff.length;
	const h1 = new Float64Array(n);
	const h2 = new Float64Array(n);
	const coherence = new Float64Array(n);
	for (let k = 0; k < n; k++) {
		h1[k] = gff[k] > 0 ? Math.hypot(gre[k], gim[k]) / gff[k] : 0;
		const gfx = Math.hypot(gre[k], gim[k]);
		h2[k] = gfx > 0 ? gxx[k] / gfx : 0;
		coherence[k] = gff[k] > 0 && gxx[k] > 0 ? (gre[k] ** 2 + gim[k] ** 2) / (gff[k] * gxx[k]) : 0;
	}
	return { h1, h2, coherence };
}

/** The FRF's modes up to bin kMax, tallest first: half-power frequency and damping, and flags. */
function frfModes(
	frf: ReturnType<typeof frfOf>,
	kMax: number,
	df: number,
	resolution: number,
	averages: number,
	tauW: number | null,
	options: ImpactOptions
): FrfMode[] {
	const mag = frf.h1;
	let tallest = 0;
	for (let k = 2; k <= kMax; k++) tallest = Math.max(tallest, mag[k]);
	const minProm = options.minProminence ?? 0.02;
	const peaks = findPeaks(mag, 2, kMax, tallest * minProm)
		.filter((p) => p.prominence >= tallest * minProm)
		.sort((a, b) => b.prominence - a.prominence)
		.slice(0, options.maxModes ?? 6);
	const modes: FrfMode[] = peaks.map((p) => {
		const ip = interpolatePeak(mag, p.bin);
		const fPeak = ip.bin * df;
		const hp = halfPowerBins(mag, p.bin, ip.height);
		// exact for the FRF's type: an accelerance peaks above f_n, a receptance below it
		const exact = hp
			? halfPowerExact(hp[0] * df, hp[1] * df, options.responseKind ?? 'acceleration')
			: null;
		const f = exact ? exact.naturalHz : fPeak;
		const windowDamping = tauW ? 1 / (2 * Math.PI * f * tauW) : 0;
		const zeta = exact ? Math.max(0, exact.dampingRatio - windowDamping) : null;
		const flags: FrfMode['flags'] = [];
		const coherence = averages >= MIN_COHERENCE_AVERAGES ? frf.coherence[p.bin] : null;
		if (coherence !== null && coherence < 0.9) flags.push('low-coherence');

		if (hp && (hp[1] - hp[0]) * df < 5 * resolution) flags.push('coarse-resolution');
		return {
			frequencyHz: f,
			dampingRatio: zeta && zeta > 0 ? zeta : null,
			qFactor: zeta && zeta > 0 ? 1 / (2 * zeta) : null,
			amplitude: ip.height,
			h2Amplitude: interpolatePeak(frf.h2, p.bin).height,
			coherence,
			flags
		};
	});
	return modes.sort((a, b) => b.amplitude - a.amplitude);
}

export function analyzeImpact(
	force: ArrayLike<number>,
	response: ArrayLike<number>,
	sampleRateHz: number,
	options: ImpactOptions = {}
): ImpactResult {
	const fs = positive('sampleRateHz', sampleRateHz);
	checkChannels(force, response);
	const progress = options.onProgress ?? (() => {});
	const trigger = positive('trigger', options.trigger ?? 0.1);
	const tauW = options.exponentialWindowS ?? null;
	const { hits, accepted, seg } = hitsAndSegment(force, trigger);
	const pre = Math.floor((options.preTrigger ?? 0.05) * seg);
	const spectra = averagedSpectra(force, response, fs, accepted, seg, pre, tauW, progress);
	const { averages, nfft } = spectra;
	const frf = frfOf(spectra);
	const df = fs / nfft;
	const resolution = fs / seg;
	const kBand = usableBandEnd(spectra.gff, positive('forceDropDb', options.forceDropDb ?? 10));
	const fMax = Math.min(options.maxFrequencyHz ?? Infinity, 0.45 * fs, kBand * df);
	const kMax = Math.floor(fMax / df);
	const modes = frfModes(frf, kMax, df, resolution, averages, tauW, options);
	const dec = bucketMax(
		kMax + 1,
		2048,
		(k) => frf.h1[k],
		(k) => k * df
	);
	const cohDec =
		averages >= MIN_COHERENCE_AVERAGES ? dec.x.map((fx) => frf.coherence[Math.round(fx / df)]) : [];
	progress(1);
	return {
		hits,
		averages,
		resolutionHz: resolution,
		usableBandHz: [0, kMax * df],
		modes,
		frf: { frequencyHz: dec.x, magnitude: dec.y, coherence: cohDec }
	};
}

/**
 * The last bin of the band the hammer excited: the first where the force autospectrum falls
 * `dropDb` below its level at the low end (the median of bins 1–8).
 */
function usableBandEnd(gff: Float64Array, dropDb: number): number {
	const low = Array.from(gff.subarray(1, 9)).sort((a, b) => a - b)[4] ?? 0;
	const floor = low * 10 ** (-dropDb / 10); // gff is a power spectrum
	let k = 1;
	while (k < gff.length - 1 && gff[k] >= floor) k++;
	return k;
}

function nextHitGap(h: Hit, hits: Hit[], length: number): number {
	const later = hits.filter((o) => o.index > h.index);
	return (later.length ? later[0].index : length) - h.index;
}
