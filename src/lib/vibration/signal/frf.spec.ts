import { describe, expect, it } from 'vitest';
import { Solver } from 'odex';
import { analyzeImpact, detectHits } from './frf.ts';
import { magnification } from '../oscillator.ts';

/**
 * Hammer hits (half-sine force pulses) through an SDOF system, integrated with ODEX (an independent
 * integrator from the registry). Returns force and displacement sampled at fs.
 */
function impactRecord(
	fs: number,
	seconds: number,
	f: number,
	zeta: number,
	hitsAt: number[],
	amplitudes: number[] = [],
	pulse = 0.002
) {
	const w = 2 * Math.PI * f;
	const F = (t: number) => {
		let v = 0;
		hitsAt.forEach((t0, i) => {
			if (t >= t0 && t < t0 + pulse)
				v += (amplitudes[i] ?? 1) * Math.sin((Math.PI * (t - t0)) / pulse);
		});
		return v;
	};
	const solver = new Solver(2);
	solver.absoluteTolerance = 1e-12;
	solver.relativeTolerance = 1e-10;
	solver.maxSteps = 1e6;
	const n = Math.round(fs * seconds);
	const force = new Float64Array(n);
	const x = new Float64Array(n);
	let y = [0, 0];
	for (let i = 1; i < n; i++) {
		const t0 = (i - 1) / fs;
		// step across each pulse finely enough that the integrator sees it
		y = solver.solve((t, s) => [s[1], -2 * zeta * w * s[1] - w * w * s[0] + F(t)], t0, y, i / fs).y;
		x[i] = y[0];
		force[i] = F(i / fs);
	}
	return { force, x };
}

describe('two-channel impact analysis', () => {
	it('recovers the FRF peak of an SDOF system from three averaged hits, with coherence near 1', () => {
		const fs = 2048;
		const f = 45;
		const zeta = 0.02;
		const { force, x } = impactRecord(fs, 12, f, zeta, [0.5, 4.5, 8.5], [1, 0.8, 1.2]);
		const r = analyzeImpact(force, x, fs);
		expect(r.averages).toBe(3);
		const m = r.modes[0];
		// the receptance peaks at f·√(1 − 2ζ²) (domain.md F7)
		expect(Math.abs(m.frequencyHz - f * Math.sqrt(1 - 2 * zeta * zeta)) / f).toBeLessThan(0.005);
		expect(Math.abs((m.dampingRatio as number) - zeta) / zeta).toBeLessThan(0.2);
		expect(m.coherence as number).toBeGreaterThan(0.95);
		// |H| at the peak ≈ (1/k)·peak DMF, with k = ω² for unit mass
		const k = (2 * Math.PI * f) ** 2;
		expect(
			Math.abs(m.amplitude * k - magnification(Math.sqrt(1 - 2 * zeta * zeta), zeta)) /
				(1 / (2 * zeta))
		).toBeLessThan(0.1);
	});

	it('rejects a double hit and averages the clean ones', () => {
		const fs = 2048;
		const { force, x } = impactRecord(fs, 12, 45, 0.02, [0.5, 4.5, 4.515, 8.5]);
		const r = analyzeImpact(force, x, fs);
		expect(r.hits.filter((h) => !h.accepted).map((h) => h.reason)).toEqual([
			'double hit',
			'double hit (second strike)'
		]);
		expect(r.averages).toBe(2);
	});

	it('detects pulses above the trigger', () => {
		const f = new Float64Array(100);
		f[10] = 1;
		f[11] = 1;
		f[60] = 0.5;
		expect(detectHits(f, 0.1, 5).map((h) => [h.index, h.width])).toEqual([
			[10, 2],
			[60, 1]
		]);
	});

	it('refuses a flat force channel and mismatched channels', () => {
		expect(() => analyzeImpact(new Float64Array(128), new Float64Array(128), 100)).toThrow(
			/at least one hammer hit/
		);
		expect(() => analyzeImpact(new Float64Array(128), new Float64Array(100), 100)).toThrow(
			/response channel must be as long as the force channel/
		);
	});

	it('weighs force and response by the exponential window from the trigger, so |H1| keeps its height', () => {
		// the first version windowed the response alone from the segment start: |H1| fell by
		// e^(−t_pre/τ_w), 18 % at the default pre-trigger with a short window
		const fs = 2048;
		const f = 45;
		const zeta = 0.01;
		const { force, x } = impactRecord(fs, 12, f, zeta, [0.5, 4.5, 8.5]);
		const plain = analyzeImpact(force, x, fs).modes[0];
		const tau = 0.25;
		const windowed = analyzeImpact(force, x, fs, { exponentialWindowS: tau, preTrigger: 0.2 })
			.modes[0];
		// the window widens the peak (Δζ = 1/(ωτ)) and so lowers it by ζ/(ζ + Δζ); with the
		// correction undone the height matches the unwindowed one
		const dz = 1 / (2 * Math.PI * f * tau);
		expect(
			Math.abs((windowed.amplitude * (zeta + dz)) / zeta - plain.amplitude) / plain.amplitude
		).toBeLessThan(0.1);
		expect(Math.abs((windowed.dampingRatio as number) - zeta) / zeta).toBeLessThan(0.2);
	});

	it('ends the band where the hammer’s spectrum has fallen 10 dB, and finds no mode above it', () => {
		// a soft 12 ms tip: the half-sine's spectrum falls 10 dB near 0.6/T ≈ 55 Hz and has its
		// first null at 1.5/T = 125 Hz; a 300 Hz mode is beyond what this hammer can measure
		const fs = 2048;
		const { force, x } = impactRecord(fs, 12, 30, 0.02, [0.5, 4.5, 8.5], [], 0.012);
		const r = analyzeImpact(force, x, fs);
		expect(r.usableBandHz[1]).toBeGreaterThan(35);
		expect(r.usableBandHz[1]).toBeLessThan(125);
		expect(r.modes.every((m) => m.frequencyHz <= r.usableBandHz[1])).toBe(true);
		expect(Math.abs(r.modes[0].frequencyHz - 30) / 30).toBeLessThan(0.01);
	});

	it('reports coherence only from three averages on, and H2 at or above H1', () => {
		const fs = 2048;
		const one = impactRecord(fs, 4, 45, 0.02, [0.5]);
		const single = analyzeImpact(one.force, one.x, fs);
		expect(single.averages).toBe(1);
		expect(single.modes[0].coherence).toBeNull();
		expect(single.frf.coherence).toEqual([]);
		const three = impactRecord(fs, 12, 45, 0.02, [0.5, 4.5, 8.5], [1, 0.8, 1.2]);
		const r = analyzeImpact(three.force, three.x, fs);
		expect(r.modes[0].coherence).not.toBeNull();
		// γ² = |H1| / |H2| bin by bin (both from the same spectra): H2 ≥ H1; noise-free here, so
		// the two agree closely
		const m = r.modes[0];
		expect(m.h2Amplitude).toBeGreaterThanOrEqual(m.amplitude * (1 - 1e-3));
		expect(Math.abs(m.amplitude / m.h2Amplitude - (m.coherence as number))).toBeLessThan(0.01);
	});
});
