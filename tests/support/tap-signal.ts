/**
 * Bump tests as a structure gives them, for the tap-capture tests and benchmark: each mode the
 * damped single-degree-of-freedom oscillator x″ + 2ζω₀x′ + ω₀²x = F(t)/m in standard form, its
 * response to a half-sine hammer pulse integrated by ODEX (an integrator from the registry, with
 * dense output on the sample grid; independent of Detune's analysis), the acceleration
 * a = F − 2ζω₀x′ − ω₀²x measured as an accelerometer would. The structure is linear and does not
 * change with time, so a record of several hits is the one-pulse response shifted and scaled
 * (modal superposition), with the noise of a running plant and, when asked, a machine tone.
 */
import { sampled } from './odex.ts';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { WaveFile } from '../../src/lib/recordings/wavefile.ts';

export interface TapMode {
	f: number;
	zeta: number;
	/** the mode's share of the response */
	gain: number;
}

/** A hammer's contact time: 2 ms, a medium tip on steel (common practice, from memory). */
export const PULSE_S = 0.002;

/** One mode's acceleration after a unit half-sine pulse at t = 0, `seconds` long at `fs`. */
export function pulseAcceleration(fs: number, seconds: number, m: TapMode, pulseS = PULSE_S) {
	const w = 2 * Math.PI * m.f;
	const F = (t: number) => (t < pulseS ? Math.sin((Math.PI * t) / pulseS) : 0);
	const rhs = (t: number, y: number[]) => [y[1], F(t) - 2 * m.zeta * w * y[1] - w * w * y[0]];
	return sampled(rhs, [0, 0], fs, Math.round(seconds * fs), (t, y) => rhs(t, y)[1], {
		maxSteps: 1e7
	});
}

/** A seeded uniform generator in −0.5…0.5 (xorshift), so every run makes the same noise. */
export function noise(seed: number) {
	let s = seed >>> 0 || 1;
	return () => {
		s ^= s << 13;
		s >>>= 0;
		s ^= s >> 17;
		s ^= s << 5;
		s >>>= 0;
		return s / 4294967296 - 0.5;
	};
}

export interface TapRecordSpec {
	fs: number;
	seconds: number;
	modes: TapMode[];
	/** each strike's time (s) and relative force */
	hits: { at: number; force: number }[];
	/** the largest |sample| of the clean record, full scale */
	peak: number;
	/** uniform noise, as a share of `peak` */
	noise: number;
	/** a running machine's tone: frequency (Hz) and amplitude as a share of `peak` */
	tone?: { hz: number; share: number };
	/** how long each hit's ring-down is integrated (s) */
	ringS?: number;
	seed?: number;
}

export function tapRecord(spec: TapRecordSpec): Float64Array {
	const { fs } = spec;
	const n = Math.round(spec.seconds * fs);
	const ring = Math.min(n, Math.round((spec.ringS ?? 3) * fs));
	const one = new Float64Array(ring);
	for (const m of spec.modes) {
		const a = pulseAcceleration(fs, ring / fs, m);
		for (let i = 0; i < ring; i++) one[i] += m.gain * a[i];
	}
	const clean = new Float64Array(n);
	for (const h of spec.hits) {
		const at = Math.round(h.at * fs);
		for (let i = 0; i < ring && at + i < n; i++) clean[at + i] += h.force * one[i];
	}
	let max = 0;
	for (const v of clean) max = Math.max(max, Math.abs(v));
	const r = noise(spec.seed ?? 7);
	const out = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const tone = spec.tone
			? spec.tone.share * spec.peak * Math.sin(2 * Math.PI * spec.tone.hz * (i / fs))
			: 0;
		out[i] = (clean[i] / max) * spec.peak + tone + spec.noise * spec.peak * r();
	}
	return out;
}

/** A mono float 32-bit WAV of `samples`, as the fake capture device plays it. */
export function wavOf(samples: ArrayLike<number>, fs: number): Uint8Array {
	const wav = new WaveFile();
	wav.fromScratch(1, fs, '32f', Float32Array.from(samples));
	return wav.toBuffer();
}

/** `tapRecord(spec)` as a WAV in a new temporary folder, for chromium's fake capture device. */
export function writeTapWav(spec: TapRecordSpec, name = 'strikes.wav'): string {
	const path = join(mkdtempSync(join(tmpdir(), 'detune-tap-')), name);
	writeFileSync(path, wavOf(tapRecord(spec), spec.fs));
	return path;
}
