import { describe, expect, it } from 'vitest';
import { stepwise } from '../../../../tests/support/odex.ts';
import { analyzeRingdown, detrend, hasSecondHit, isClipped } from './ringdown.ts';
import { magnitude, realFft } from './spectrum.ts';

/** Seeded Gaussian noise (Box–Muller over a linear congruential generator), for repeatable tests. */
function noise(seed: number) {
	let s = seed;
	const u = () => ((s = (s * 1664525 + 1013904223) % 4294967296) + 1) / 4294967297;
	return () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
}

/** Closed-form free decay of a sum of modes (the SDOF free response, Rao §2.6). */
function ringdown(
	fs: number,
	seconds: number,
	modes: { f: number; zeta: number; a: number }[],
	extra: (t: number) => number = () => 0
): Float64Array {
	const n = Math.round(fs * seconds);
	const x = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const t = i / fs;
		let v = extra(t);
		for (const m of modes) {
			const w = 2 * Math.PI * m.f;
			v += m.a * Math.exp(-m.zeta * w * t) * Math.sin(w * Math.sqrt(1 - m.zeta ** 2) * t);
		}
		x[i] = v;
	}
	return x;
}

const fd = (f: number, z: number) => f * Math.sqrt(1 - z * z);

describe('the FFT', () => {
	it('matches a naive DFT to 1e-9 relative (independent transform written here)', () => {
		const n = 64;
		const r = noise(1);
		const x = Array.from({ length: 50 }, () => r());
		const s = realFft(x, n);
		let scale = 0;
		for (let k = 0; k <= n / 2; k++) scale = Math.max(scale, Math.hypot(s.re[k], s.im[k]));
		for (let k = 0; k <= n / 2; k++) {
			let re = 0;
			let im = 0;
			for (let j = 0; j < x.length; j++) {
				re += x[j] * Math.cos((2 * Math.PI * k * j) / n);
				im -= x[j] * Math.sin((2 * Math.PI * k * j) / n);
			}
			expect(Math.abs(s.re[k] - re) / scale).toBeLessThan(1e-9);
			expect(Math.abs(s.im[k] - im) / scale).toBeLessThan(1e-9);
		}
		expect(magnitude(s)[0]).toBeCloseTo(Math.abs(x.reduce((a, b) => a + b, 0)), 9);
	});
});

describe('ring-down analysis of synthetic recordings (closed form)', () => {
	it.each([
		[12, 0.005],
		[37, 0.02],
		[95, 0.1],
		[240, 0.01]
	])('one mode at %s Hz, ζ = %s: frequency within 0.5 %%, damping within 20 %%', (f, zeta) => {
		const fs = 2048;
		const tau = 1 / (zeta * 2 * Math.PI * f);
		const x = ringdown(fs, Math.max(2, 8 * tau), [{ f, zeta, a: 1 }]);
		const r = analyzeRingdown(x, fs);
		expect(r.modes.length).toBeGreaterThanOrEqual(1);
		const m = r.modes[0];
		// the natural frequency f_n from the decay fit, and the damped one it rings at
		expect(m.frequencySource).toBe('decay-fit');
		expect(Math.abs(m.frequencyHz - f) / f).toBeLessThan(0.005);
		expect(Math.abs(m.dampedFrequencyHz - fd(f, zeta)) / f).toBeLessThan(0.005);
		expect(Math.abs((m.dampingRatio as number) - zeta) / zeta).toBeLessThan(0.2);
		expect(Math.abs((m.halfPowerDamping as number) - zeta) / zeta).toBeLessThan(0.2);
		expect(Math.abs((m.decayDamping as number) - zeta) / zeta).toBeLessThan(0.2);
		expect(m.qFactor).toBeCloseTo(1 / (2 * (m.dampingRatio as number)), 9);
		expect(Math.abs(m.amplitude - 1)).toBeLessThan(0.2);
		expect(m.flags).not.toContain('short-record');
	});

	it('separates two and three modes, strongest first, each within tolerance', () => {
		const fs = 4096;
		const truth = [
			{ f: 18.5, zeta: 0.02, a: 1 },
			{ f: 61, zeta: 0.01, a: 0.6 },
			{ f: 143, zeta: 0.03, a: 0.35 }
		];
		for (const set of [truth.slice(0, 2), truth]) {
			const x = ringdown(fs, 10, set);
			const r = analyzeRingdown(x, fs);
			expect(r.modes.length).toBeGreaterThanOrEqual(set.length);
			set.forEach((m, i) => {
				const got = r.modes[i];
				expect(Math.abs(got.frequencyHz - m.f) / m.f, `mode ${m.f}`).toBeLessThan(0.005);
				expect(
					Math.abs((got.dampingRatio as number) - m.zeta) / m.zeta,
					`ζ of ${m.f}`
				).toBeLessThan(0.2);
			});
		}
	});

	it('holds up with 2 % noise and a 60 Hz line tone, which it reports as a tone, not a mode', () => {
		const fs = 2048;
		const r0 = noise(7);
		const x = ringdown(
			fs,
			8,
			[{ f: 24, zeta: 0.015, a: 1 }],
			(t) => 0.05 * Math.sin(2 * Math.PI * 60 * t) + 0.02 * r0()
		);
		const r = analyzeRingdown(x, fs);
		const m = r.modes[0];
		expect(Math.abs(m.frequencyHz - 24) / 24).toBeLessThan(0.005);
		expect(Math.abs((m.dampingRatio as number) - 0.015) / 0.015).toBeLessThan(0.2);
		expect(r.modes.some((q) => Math.abs(q.frequencyHz - 60) < 1)).toBe(false);
		expect(r.tones.some((t) => Math.abs(t.frequencyHz - 60) < 0.5)).toBe(true);
	});

	it('flags a record shorter than six time constants', () => {
		const fs = 2048;
		const zeta = 0.005;
		const f = 10;
		const tau = 1 / (zeta * 2 * Math.PI * f);
		const r = analyzeRingdown(ringdown(fs, 2 * tau, [{ f, zeta, a: 1 }]), fs);
		expect(r.modes[0].flags).toContain('short-record');
		expect(Math.abs(r.modes[0].frequencyHz - f) / f).toBeLessThan(0.005);
	});

	it('flags resolution too coarse for the bandwidth', () => {
		const fs = 1024;
		// ζ = 0.002 at 50 Hz: half-power width 0.2 Hz against a 1 Hz resolution of a 1 s record
		const r = analyzeRingdown(ringdown(fs, 1, [{ f: 50, zeta: 0.002, a: 1 }]), fs);
		expect(r.modes[0].flags).toContain('coarse-resolution');
	});

	it('flags clipping and a double hit', () => {
		const fs = 2048;
		const clipped = ringdown(fs, 6, [{ f: 30, zeta: 0.02, a: 1 }]).map((v) =>
			Math.max(-0.6, Math.min(0.6, v))
		);
		expect(isClipped(clipped)).toBe(true);
		expect(analyzeRingdown(clipped, fs).flags).toContain('clipping');
		const clean = ringdown(fs, 6, [{ f: 30, zeta: 0.02, a: 1 }]);
		expect(isClipped(clean)).toBe(false);
		const second = ringdown(fs, 6, [{ f: 30, zeta: 0.02, a: 1 }]);
		const later = ringdown(fs, 6, [{ f: 30, zeta: 0.02, a: 0.8 }]);
		const shift = Math.round(0.6 * fs);
		for (let i = shift; i < second.length; i++) second[i] += later[i - shift];
		expect(hasSecondHit(second, fs)).toBe(true);
		expect(hasSecondHit(clean, fs)).toBe(false);
		const r = analyzeRingdown(second, fs);
		expect(r.flags).toContain('double-hit');
		expect(r.modes[0].flags).toContain('double-hit');
	});

	it('subtracts the damping an exponential window adds (Δζ = 1/(ω·τ_w))', () => {
		const fs = 2048;
		const x = ringdown(fs, 8, [{ f: 40, zeta: 0.01, a: 1 }]);
		const r = analyzeRingdown(x, fs, { exponentialWindowS: 1 });
		// the window alone would add 1/(2π·40·1) = 0.004 to the half-power estimate
		expect(Math.abs((r.modes[0].halfPowerDamping as number) - 0.01) / 0.01).toBeLessThan(0.2);
	});

	it('reports progress and chart data', () => {
		const seen: number[] = [];
		const r = analyzeRingdown(ringdown(1024, 4, [{ f: 20, zeta: 0.02, a: 1 }]), 1024, {
			onProgress: (p) => seen.push(p)
		});
		expect(seen.at(-1)).toBe(1);
		expect(seen.every((p, i) => i === 0 || p >= seen[i - 1])).toBe(true);
		expect(r.spectrum.frequencyHz.length).toBeLessThanOrEqual(2048);
		expect(r.waveform.timeS.length).toBeLessThanOrEqual(2000);
		expect(r.waveform.envelope.length).toBe(r.waveform.timeS.length);
	});

	it('refuses bad input with a message', () => {
		expect(() => analyzeRingdown([1, 2, 3], 100)).toThrow(
			/number of samples must be a whole number of at least 64/
		);
		expect(() => analyzeRingdown(new Float64Array(100), 0)).toThrow(
			/sampleRateHz must be greater than zero/
		);
		const withNaN = new Float64Array(100).fill(1);
		withNaN[42] = NaN;
		expect(() => analyzeRingdown(withNaN, 100)).toThrow(/samples\[42\] must be a finite number/);
		expect(() => analyzeRingdown(new Float64Array(100).fill(3), 100)).toThrow(/flat/);
	});

	it('removes mean and trend', () => {
		const y = detrend(Array.from({ length: 100 }, (_, i) => 5 + 0.1 * i));
		expect(Math.max(...y.map(Math.abs))).toBeLessThan(1e-9);
	});
});

/** A record of `seconds` with the hit at `hitS`: modes ring from it, tones run the whole time. */
function runningMachine(
	fs: number,
	seconds: number,
	hitS: number,
	modes: { f: number; zeta: number; a: number }[],
	tones: { f: number; a: number; phase?: number }[],
	noiseRms = 0,
	seed = 11
): Float64Array {
	const r = noise(seed);
	const n = Math.round(fs * seconds);
	const x = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const t = i / fs;
		let v = noiseRms * r();
		for (const tone of tones)
			v += tone.a * Math.sin(2 * Math.PI * tone.f * t + (tone.phase ?? 0.3));
		if (t >= hitS)
			for (const m of modes) {
				const w = 2 * Math.PI * m.f;
				const u = t - hitS;
				v += m.a * Math.exp(-m.zeta * w * u) * Math.sin(w * Math.sqrt(1 - m.zeta ** 2) * u);
			}
		x[i] = v;
	}
	return x;
}

describe('bump tests on a running machine (closed-form modes plus steady tones)', () => {
	// the first version took the first sample above a tenth of the largest as the hit: with a tone
	// of the machine above that level the "hit" was sample 0 and the pre-hit record entered the fit
	it.each([1, 3, 5])(
		'finds the hit, the mode and the tone with a running tone %s× the mode’s amplitude',
		(ratio) => {
			const fs = 4096;
			const hitS = 0.5;
			const x = runningMachine(
				fs,
				4,
				hitS,
				[{ f: 42, zeta: 0.02, a: 1 }],
				[{ f: 24.8, a: ratio }],
				0.01
			);
			const r = analyzeRingdown(x, fs);
			expect(Math.abs(r.hitIndex / fs - hitS), 'hit').toBeLessThan(0.005);
			const tone = r.tones.find((t) => Math.abs(t.frequencyHz - 24.8) < 0.01);
			expect(tone, 'the tone').toBeDefined();
			expect(Math.abs(tone!.amplitude - ratio) / ratio).toBeLessThan(0.02);
			expect(
				r.modes.some((m) => Math.abs(m.frequencyHz - 24.8) < 1),
				'tone as mode'
			).toBe(false);
			const m = r.modes[0];
			expect(Math.abs(m.frequencyHz - 42) / 42).toBeLessThan(0.005);
			expect(Math.abs((m.dampingRatio as number) - 0.02) / 0.02).toBeLessThan(0.2);
			expect(Math.abs(m.amplitude - 1)).toBeLessThan(0.1);
		}
	);

	it('keeps every mode of a 3-mode record from 0.5 s to 4 s long, and beside three running tones from 2 s', () => {
		// a steady line grows with the record while a decaying mode does not: with the threshold at
		// 2 % of the tallest peak, tones included, the weak modes vanished on the longer records
		const fs = 4096;
		const truth = [
			{ f: 31, zeta: 0.03, a: 1 },
			{ f: 88, zeta: 0.02, a: 0.4 },
			{ f: 205, zeta: 0.015, a: 0.2 }
		];
		// running speed 1,482 rpm, its second order, and twice a 60 Hz line
		const tones = [
			{ f: 24.7, a: 2 },
			{ f: 49.4, a: 1 },
			{ f: 120, a: 0.5 }
		];
		// (a tone 6 Hz from a mode needs a record long enough to tell them apart: from 2 s here)
		const cases = [0.5, 1, 2, 4].map((s) => [s, []] as const);
		for (const [seconds, running] of [...cases, [2, tones] as const, [4, tones] as const]) {
			const r = analyzeRingdown(runningMachine(fs, seconds, 0.1, truth, [...running], 0.005), fs);
			for (const m of truth) {
				const got = r.modes.find((q) => Math.abs(q.frequencyHz - m.f) / m.f < 0.005);
				expect(got, `${m.f} Hz in a ${seconds} s record, ${running.length} tones`).toBeDefined();
			}
			expect(r.modes.slice(0, 3).map((q) => Math.round(q.frequencyHz))).toEqual([31, 88, 205]);
			for (const t of running)
				expect(r.tones.some((q) => Math.abs(q.frequencyHz - t.f) < 0.01)).toBe(true);
		}
	});

	it('keeps a close pair 4 % apart as two modes, not a tone, and says they are close', () => {
		// the pair beats, so its envelope looks steady over stretches; it is absent before the hit
		const fs = 2048;
		const r = analyzeRingdown(
			runningMachine(
				fs,
				4,
				0.3,
				[
					{ f: 50, zeta: 0.008, a: 1 },
					{ f: 52, zeta: 0.008, a: 0.8 }
				],
				[],
				0.002
			),
			fs
		);
		const near = (f: number) => r.modes.find((m) => Math.abs(m.frequencyHz - f) / f < 0.005);
		expect(near(50)).toBeDefined();
		expect(near(52)).toBeDefined();
		expect(near(50)!.flags).toContain('close-mode');
		expect(r.tones.filter((t) => t.frequencyHz > 45 && t.frequencyHz < 57)).toEqual([]);
	});

	it('gives the same amplitude for a 1 s and an 8 s record of the same hit, and ranks by it', () => {
		const fs = 2048;
		const modes = [
			{ f: 40, zeta: 0.01, a: 0.5 },
			{ f: 130, zeta: 0.04, a: 1 }
		];
		const short = analyzeRingdown(runningMachine(fs, 1, 0.05, modes, [], 0.001), fs);
		const long = analyzeRingdown(runningMachine(fs, 8, 0.05, modes, [], 0.001), fs);
		for (const r of [short, long]) {
			expect(Math.round(r.modes[0].frequencyHz)).toBe(130); // the stronger, though more damped
			expect(Math.abs(r.modes[0].amplitude - 1)).toBeLessThan(0.1);
			expect(Math.abs(r.modes[1].amplitude - 0.5)).toBeLessThan(0.05);
		}
	});

	it('reports the natural frequency, not the damped peak, at ζ = 0.08', () => {
		// f_d = f_n √(1 − ζ²) is 0.32 % below f_n, and a displacement spectrum peaks 0.64 % below
		const fs = 4096;
		const r = analyzeRingdown(runningMachine(fs, 2, 0.1, [{ f: 60, zeta: 0.08, a: 1 }], []), fs);
		const m = r.modes[0];
		expect(m.frequencySource).toBe('decay-fit');
		expect(Math.abs(m.frequencyHz - 60) / 60).toBeLessThan(0.001);
		expect(Math.abs(m.dampedFrequencyHz - 60 * Math.sqrt(1 - 0.08 ** 2)) / 60).toBeLessThan(0.001);
	});

	it.each([0.15, 0.3])(
		'at ζ = %s reports the decay estimate, and the exact half-power form agrees with it',
		(zeta) => {
			// ζ ≈ Δf/2f reads about 5 % high at ζ = 0.15 and 26 % at 0.3; halfPowerExact does not
			const fs = 4096;
			const r = analyzeRingdown(runningMachine(fs, 1, 0.1, [{ f: 80, zeta, a: 1 }], [], 1e-4), fs);
			const m = r.modes[0];
			expect(Math.abs((m.dampingRatio as number) - zeta) / zeta).toBeLessThan(0.2);
			expect(m.dampingRatio).toBe(m.decayDamping);
			expect(m.flags).toEqual(expect.arrayContaining(['heavy-damping']));
			expect(Math.abs((m.halfPowerDamping as number) - zeta) / zeta).toBeLessThan(0.1);
			expect(m.flags).not.toContain('half-power-invalid');
		}
	);

	it('flags half-power damping beyond ζ = 0.3 and reports the decay estimate', () => {
		const fs = 4096;
		const r = analyzeRingdown(
			runningMachine(fs, 1, 0.1, [{ f: 80, zeta: 0.34, a: 1 }], [], 1e-4),
			fs
		);
		const m = r.modes[0];
		expect(m.dampingRatio).toBe(m.decayDamping);
		expect(Math.abs((m.dampingRatio as number) - 0.34) / 0.34).toBeLessThan(0.2);
		expect(m.halfPowerDamping).toBeGreaterThan(0.3);
		expect(m.flags).toContain('half-power-invalid');
	});
});

/**
 * The response of x″ + 2ζω x′ + ω² x = F(t) from rest, sampled at fs, by ODEX (an integrator from
 * the registry, independent of the analysis).
 */
function odexResponse(fs: number, n: number, f: number, zeta: number, F: (t: number) => number) {
	const w = 2 * Math.PI * f;
	const x = new Float64Array(n);
	const rhs = (t: number, s: number[]) => [s[1], -2 * zeta * w * s[1] - w * w * s[0] + F(t)];
	stepwise(rhs, [0, 0], fs, n, (i, y) => (x[i] = y[0]));
	return x;
}

describe('against an independent integrator', () => {
	it('recovers f and ζ from the ODEX response of m x″ + c x′ + k x = F(t) to a half-sine pulse', () => {
		const fs = 2048;
		const f = 31;
		const zeta = 0.025;
		const pulse = 0.003; // 3 ms hammer contact
		const F = (t: number) => (t < pulse ? Math.sin((Math.PI * t) / pulse) : 0);
		const x = odexResponse(fs, fs * 6, f, zeta, F);
		const r = analyzeRingdown(x, fs);
		expect(Math.abs(r.modes[0].frequencyHz - f) / f).toBeLessThan(0.005);
		expect(Math.abs((r.modes[0].dampingRatio as number) - zeta) / zeta).toBeLessThan(0.2);
	});

	it('recovers f and ζ of the ODEX response to a hammer pulse on a running machine (tone 3×, noise)', () => {
		// the half-sine pulse arrives at 0.4 s; the machine runs at 1,490 rpm (24.83 Hz) throughout
		const fs = 2048;
		const f = 57;
		const zeta = 0.03;
		const t0 = 0.4;
		const pulse = 0.002;
		const F = (t: number) =>
			t >= t0 && t < t0 + pulse ? Math.sin((Math.PI * (t - t0)) / pulse) : 0;
		const resp = odexResponse(fs, fs * 3, f, zeta, F);
		let peak = 0;
		for (const v of resp) peak = Math.max(peak, Math.abs(v));
		const r0 = noise(5);
		const x = resp.map(
			(v, i) => v + 3 * peak * Math.sin(2 * Math.PI * 24.83 * (i / fs)) + 0.01 * peak * r0()
		);
		const r = analyzeRingdown(x, fs);
		expect(Math.abs(r.hitIndex / fs - t0)).toBeLessThan(0.005);
		expect(r.tones.some((t) => Math.abs(t.frequencyHz - 24.83) < 0.01)).toBe(true);
		expect(Math.abs(r.modes[0].frequencyHz - f) / f).toBeLessThan(0.005);
		expect(Math.abs((r.modes[0].dampingRatio as number) - zeta) / zeta).toBeLessThan(0.2);
	});
});

describe('records of several hits', () => {
	// five hammer strikes of unequal force at irregular times, as a technician takes them
	const fs = 2048;
	const strikes = [
		{ t: 0.3, force: 1 },
		{ t: 2.1, force: 0.7 },
		{ t: 4.4, force: 1.2 },
		{ t: 6.2, force: 0.9 },
		{ t: 8.5, force: 1.1 }
	];
	const pulse = 0.003;
	const F = (t: number) => {
		for (const s of strikes)
			if (t >= s.t && t < s.t + pulse) return s.force * Math.sin((Math.PI * (t - s.t)) / pulse);
		return 0;
	};
	// two modes, each the ODEX response of its own SDOF to the same strikes (modal superposition)
	const truth = [
		{ f: 31, zeta: 0.02, gain: 1 },
		{ f: 83, zeta: 0.015, gain: 4 }
	];
	const responses = truth.map((m) => odexResponse(fs, fs * 10, m.f, m.zeta, F));
	const clean = responses[0].map((v, i) => truth[0].gain * v + truth[1].gain * responses[1][i]);
	let peak = 0;
	for (const v of clean) peak = Math.max(peak, Math.abs(v));

	it('finds each of five hits with noise, analyses each, and combines the modes (ODEX response)', () => {
		const r0 = noise(11);
		const x = clean.map((v) => v + 0.01 * peak * r0());
		const r = analyzeRingdown(x, fs);
		// before, the whole record from the first hit was one segment: its spectrum was a comb of
		// lines 1/(hit spacing) apart, and the combs' teeth were reported as modes
		expect(r.hitIndices).toHaveLength(5);
		r.hitIndices.forEach((h, i) => expect(Math.abs(h / fs - strikes[i].t)).toBeLessThan(0.005));
		for (const m of truth) {
			const got = r.modes.find((q) => Math.abs(q.frequencyHz - m.f) / m.f < 0.005);
			expect(got, `${m.f} Hz`).toBeDefined();
			expect(got!.hits).toBe(5);
			expect(Math.abs((got!.dampingRatio as number) - m.zeta) / m.zeta).toBeLessThan(0.2);
			expect(got!.frequencySpreadHz).toBeLessThan(0.005 * m.f);
			expect(got!.flags).not.toContain('not-repeatable');
		}
		// no invented mode: whatever the hits agree on is one of the two
		for (const q of r.modes.filter((q) => !q.flags.includes('not-repeatable')))
			expect(truth.some((m) => Math.abs(q.frequencyHz - m.f) / m.f < 0.005)).toBe(true);
	});

	it('finds the hits under a running tone three times the response, once the tone is out', () => {
		const r0 = noise(12);
		const x = clean.map(
			(v, i) => v + 3 * peak * Math.sin(2 * Math.PI * 24.83 * (i / fs)) + 0.005 * peak * r0()
		);
		const r = analyzeRingdown(x, fs);
		expect(r.tones.some((t) => Math.abs(t.frequencyHz - 24.83) < 0.01)).toBe(true);
		expect(r.hitIndices).toHaveLength(5);
		for (const m of truth)
			expect(r.modes.some((q) => Math.abs(q.frequencyHz - m.f) / m.f < 0.005 && q.hits >= 4)).toBe(
				true
			);
	});

	it('flags a mode only one hit showed (a stray tap on a neighbour) and ranks it last', () => {
		// the third strike also rings a 140 Hz mode of something else
		const stray = ringdown(fs, 10 - 4.4, [{ f: 140, zeta: 0.01, a: 0.5 * peak }]);
		const x = clean.slice();
		const at = Math.round(4.4 * fs);
		for (let i = 0; i < stray.length && at + i < x.length; i++) x[at + i] += stray[i];
		const r = analyzeRingdown(x, fs);
		const odd = r.modes.find((q) => Math.abs(q.frequencyHz - 140) < 1);
		expect(odd?.hits).toBe(1);
		expect(odd?.flags).toContain('not-repeatable');
		expect(r.modes.at(-1)).toBe(odd);
	});

	it('keeps a hammer bounce 0.6 s into a ringing mode as a double hit, not a second hit', () => {
		const x = ringdown(fs, 6, [{ f: 30, zeta: 0.02, a: 1 }]);
		const later = ringdown(fs, 6, [{ f: 30, zeta: 0.02, a: 0.8 }]);
		const shift = Math.round(0.6 * fs);
		for (let i = shift; i < x.length; i++) x[i] += later[i - shift];
		const r = analyzeRingdown(x, fs);
		expect(r.hitIndices).toHaveLength(1);
		expect(r.flags).toContain('double-hit');
	});

	it('raises no double hit on a clean record of two modes, one low (its zero crossings are not hits)', () => {
		const x = ringdown(fs, 4, [
			{ f: 23, zeta: 0.02, a: 1 },
			{ f: 61, zeta: 0.01, a: 0.4 }
		]);
		expect(hasSecondHit(x, fs)).toBe(false);
		const r = analyzeRingdown(x, fs);
		expect(r.flags).not.toContain('double-hit');
		expect(r.modes.map((m) => m.flags).flat()).not.toContain('double-hit');
	});
});

describe('background subtraction', () => {
	/**
	 * The running machine by itself: white noise through a two-pole resonator at f0 (a narrow band
	 * of flow noise, say), a digital filter independent of the analysis.
	 */
	function band(fs: number, n: number, f0: number, q: number, seed: number, gain: number) {
		const r0 = noise(seed);
		const w = (2 * Math.PI * f0) / fs;
		const r = 1 - w / (2 * q);
		const a1 = 2 * r * Math.cos(w);
		const a2 = -r * r;
		const y = new Float64Array(n);
		for (let i = 2; i < n; i++) y[i] = a1 * y[i - 1] + a2 * y[i - 2] + r0();
		// scaled to an RMS of `gain`
		let e = 0;
		for (const v of y) e += v * v;
		const k = gain / Math.sqrt(e / n);
		return y.map((v) => v * k);
	}

	it('takes most of a band the running machine makes by itself out, and leaves the modes of the hit as they were', () => {
		const fs = 2048;
		const n = fs * 4;
		const hit = ringdown(fs, 4, [
			{ f: 31, zeta: 0.02, a: 1 },
			{ f: 83, zeta: 0.015, a: 0.5 }
		]);
		// the hit a quarter second in, over the machine's own 140 Hz band
		const running = band(fs, n, 140, 40, 21, 0.015);
		const x = new Float64Array(n);
		const at = Math.round(0.25 * fs);
		for (let i = 0; i < n; i++) x[i] = running[i] + (i >= at ? hit[i - at] : 0);
		const near140 = (r: ReturnType<typeof analyzeRingdown>) =>
			Math.max(
				0,
				...r.modes.filter((m) => Math.abs(m.frequencyHz - 140) < 5).map((m) => m.amplitude)
			);
		const plain = analyzeRingdown(x, fs);
		// without the background, the machine's band passes for a mode
		expect(near140(plain)).toBeGreaterThan(0.02);
		const background = band(fs, fs * 16, 140, 40, 22, 0.015);
		const r = analyzeRingdown(x, fs, { background });
		expect(r.backgroundSegments).toBe(4);
		// with it, what is left of the band is less than half (one record's power scatters about
		// the mean, so some remains), and the hit's modes are as they were
		expect(near140(r)).toBeLessThan(0.5 * near140(plain));
		for (const f of [31, 83]) {
			const before = plain.modes.find((m) => Math.abs(m.frequencyHz - f) / f < 0.005)!;
			const after = r.modes.find((m) => Math.abs(m.frequencyHz - f) / f < 0.005);
			expect(after, `${f} Hz`).toBeDefined();
			expect(Math.abs(after!.amplitude - before.amplitude) / before.amplitude).toBeLessThan(0.02);
		}
	});
});
