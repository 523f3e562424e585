import { describe, expect, it } from 'vitest';
import { Solver } from 'odex';
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
		expect(Math.abs(m.frequencyHz - fd(f, zeta)) / f).toBeLessThan(0.005);
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
				expect(Math.abs(got.frequencyHz - fd(m.f, m.zeta)) / m.f, `mode ${m.f}`).toBeLessThan(
					0.005
				);
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

describe('against an independent integrator', () => {
	it('recovers f and ζ from the ODEX response of m x″ + c x′ + k x = F(t) to a half-sine pulse', () => {
		const fs = 2048;
		const f = 31;
		const zeta = 0.025;
		const w = 2 * Math.PI * f;
		const pulse = 0.003; // 3 ms hammer contact
		const F = (t: number) => (t < pulse ? Math.sin((Math.PI * t) / pulse) : 0);
		const solver = new Solver(2);
		solver.absoluteTolerance = 1e-12;
		solver.relativeTolerance = 1e-10;
		solver.maxSteps = 1e6;
		const n = fs * 6;
		const x = new Float64Array(n);
		let y = [0, 0];
		for (let i = 1; i < n; i++) {
			y = solver.solve(
				(t, s) => [s[1], -2 * zeta * w * s[1] - w * w * s[0] + F(t)],
				(i - 1) / fs,
				y,
				i / fs
			).y;
			x[i] = y[0];
		}
		const r = analyzeRingdown(x, fs);
		expect(Math.abs(r.modes[0].frequencyHz - fd(f, zeta)) / f).toBeLessThan(0.005);
		expect(Math.abs((r.modes[0].dampingRatio as number) - zeta) / zeta).toBeLessThan(0.2);
	});
});
