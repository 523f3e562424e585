import { describe, expect, it } from 'vitest';
import { stepwise } from '../../../../tests/support/odex.ts';
import { analyzeImpact, detectHits } from './frf.ts';
import { magnification } from '../oscillator.ts';
import { EigenvalueDecomposition, Matrix, solve } from 'ml-matrix';

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
	const n = Math.round(fs * seconds);
	const force = new Float64Array(n);
	const x = new Float64Array(n);
	// step across each pulse finely enough that the integrator sees it
	const rhs = (t: number, s: number[]) => [s[1], -2 * zeta * w * s[1] - w * w * s[0] + F(t)];
	stepwise(rhs, [0, 0], fs, n, (i, y) => {
		x[i] = y[0];
		force[i] = F(i / fs);
	});
	return { force, x };
}

describe('two-channel impact analysis', () => {
	it('recovers the FRF peak of an SDOF system from three averaged hits, with coherence near 1', () => {
		const fs = 2048;
		const f = 45;
		const zeta = 0.02;
		const { force, x } = impactRecord(fs, 12, f, zeta, [0.5, 4.5, 8.5], [1, 0.8, 1.2]);
		const r = analyzeImpact(force, x, fs, { responseKind: 'displacement' });
		expect(r.averages).toBe(3);
		const m = r.modes[0];
		// the receptance peaks at f·√(1 − 2ζ²) (domain.md F7); the exact half-power form gives f_n
		expect(Math.abs(m.frequencyHz - f) / f).toBeLessThan(0.005);
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

	describe('H1 and H2 of a two-degree-of-freedom system against its exact FRF (ml-matrix)', () => {
		// masses 1 and 0.5 kg, springs ground–1 and 1–2, proportional damping C = βK; force on
		// mass 1, its displacement measured: the driving-point receptance H11
		const M = Matrix.diag([1, 0.5]);
		const [k1, k2] = [4e4, 2e4];
		const K = new Matrix([
			[k1 + k2, -k2],
			[-k2, k2]
		]);
		// undamped natural frequencies: eigenvalues of M⁻¹K
		const eig = new EigenvalueDecomposition(solve(M, K));
		const fn = eig.realEigenvalues.map((l) => Math.sqrt(l) / (2 * Math.PI)).sort((a, b) => a - b);
		const beta = (2 * 0.02) / (2 * Math.PI * fn[0]); // ζ₁ = 0.02, ζ₂ = 0.02·f₂/f₁
		// (ml-matrix's instance mul/sub work in place: the static forms make new matrices)
		const C = Matrix.mul(K, beta);
		/** |H11(f)| from (K − ω²M + iωC) z = e₁, solved as a real 4×4 system. */
		function exactH11(f: number): number {
			const w = 2 * Math.PI * f;
			const D = Matrix.sub(K, Matrix.mul(M, w * w));
			const A = new Matrix(4, 4);
			A.setSubMatrix(D, 0, 0);
			A.setSubMatrix(Matrix.mul(C, -w), 0, 2);
			A.setSubMatrix(Matrix.mul(C, w), 2, 0);
			A.setSubMatrix(D, 2, 2);
			const z = solve(A, Matrix.columnVector([1, 0, 0, 0]));
			return Math.hypot(z.get(0, 0), z.get(2, 0));
		}
		// four hammer hits, integrated by ODEX through the two equations of motion
		// a 6 ms tip: six samples across the pulse, so its sampled impulse is its integral, and a
		// force spectrum flat past both modes
		const fs = 1024;
		const hits = [0.5, 3.5, 6.5, 9.5];
		const pulse = 0.006;
		const F = (t: number) => {
			for (const t0 of hits)
				if (t >= t0 && t < t0 + pulse) return Math.sin((Math.PI * (t - t0)) / pulse);
			return 0;
		};
		const Minv = solve(M, Matrix.eye(2));
		const MK = Minv.mmul(K);
		const MC = Minv.mmul(C);
		const n = fs * 12;
		const force = new Float64Array(n);
		const x1 = new Float64Array(n);
		const rhs = (t: number, s: number[]) => [
			s[2],
			s[3],
			F(t) * Minv.get(0, 0) -
				MK.get(0, 0) * s[0] -
				MK.get(0, 1) * s[1] -
				MC.get(0, 0) * s[2] -
				MC.get(0, 1) * s[3],
			-MK.get(1, 0) * s[0] - MK.get(1, 1) * s[1] - MC.get(1, 0) * s[2] - MC.get(1, 1) * s[3]
		];
		stepwise(
			rhs,
			[0, 0, 0, 0],
			fs,
			n,
			(i, y) => {
				x1[i] = y[0];
				force[i] = F(i / fs);
			},
			{ absolute: 1e-13 }
		);

		it('finds both modes at the eigenfrequencies, |H1| at each peak as the exact |H11|', () => {
			const r = analyzeImpact(force, x1, fs, { responseKind: 'displacement' });
			expect(r.averages).toBe(4);
			const found = r.modes.map((m) => m.frequencyHz).sort((a, b) => a - b);
			for (const f of fn) {
				const m = r.modes.find((q) => Math.abs(q.frequencyHz - f) / f < 0.005);
				expect(m, `${f.toFixed(2)} Hz in ${found.join(', ')}`).toBeDefined();
				// the spectral peak sits at the interpolated bin: compare there
				const exact = Math.max(...[-0.02, 0, 0.02].map((d) => exactH11(f * (1 + d / 10))));
				expect(Math.abs(m!.amplitude - exact) / exact, `|H1| at ${f.toFixed(1)} Hz`).toBeLessThan(
					0.1
				);
				expect(Math.abs(m!.h2Amplitude - exact) / exact, `|H2| at ${f.toFixed(1)} Hz`).toBeLessThan(
					0.1
				);
			}
		});

		it('with noise on the response, H1 stays on the exact FRF, H2 lies above it and coherence drops where the response is weak', () => {
			let peak = 0;
			for (const v of x1) peak = Math.max(peak, Math.abs(v));
			let seed = 9;
			const gauss = () => {
				const u = () => ((seed = (seed * 1664525 + 1013904223) % 4294967296) + 1) / 4294967297;
				return Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
			};
			const noisy = x1.map((v) => v + 0.01 * peak * gauss());
			const r = analyzeImpact(force, noisy, fs, { responseKind: 'displacement' });
			// the antiresonance of the driving point, where mass 2 alone vibrates: √(k2/m2)
			const fa = Math.sqrt(k2 / 0.5) / (2 * Math.PI);
			const within = (lo: number, hi: number) =>
				r.frf.coherence.filter((_, i) => r.frf.frequencyHz[i] >= lo && r.frf.frequencyHz[i] <= hi);
			const m1 = r.modes.find((q) => Math.abs(q.frequencyHz - fn[0]) / fn[0] < 0.005)!;
			expect(Math.abs(m1.amplitude - exactH11(fn[0])) / exactH11(fn[0])).toBeLessThan(0.1);
			expect(m1.h2Amplitude).toBeGreaterThanOrEqual(m1.amplitude);
			expect(m1.coherence as number).toBeGreaterThan(0.9);
			// noise to spare against the weak response at the antiresonance and above the modes
			expect(Math.min(...within(fa - 1.5, fa + 1.5))).toBeLessThan(0.9);
			const above = within(2 * fn[1], r.usableBandHz[1]).sort((a, b) => a - b);
			expect(above[above.length >> 1]).toBeLessThan(0.9);
			// and none of that without the noise
			const clean = analyzeImpact(force, x1, fs, { responseKind: 'displacement' });
			expect(
				Math.min(...clean.frf.coherence.filter((_, i) => clean.frf.frequencyHz[i] < 2 * fn[1]))
			).toBeGreaterThan(0.95);
		});
	});
});
