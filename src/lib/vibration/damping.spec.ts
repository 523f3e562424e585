import { describe, expect, it } from 'vitest';
import {
	amplificationFactorFromDamping,
	dampingFromAmplificationFactor,
	dampingFromHalfPower,
	halfPowerExact,
	dampingFromLogDecrement,
	dampingFromPeakNumbers,
	dampingFromPeaksApart,
	dampingRatioFromLogDecrement,
	freeResponse,
	logDecrementFromDampingRatio,
	magnification,
	oscillatorFromModal,
	peakMagnification
} from './index.ts';
import { bisect } from './testing/bisect.ts';

describe('log decrement', () => {
	it('successive peaks in the ratio 2 give δ = 0.6931, ζ = 0.10965 (domain.md E6 [C])', () => {
		const d = dampingFromLogDecrement([2, 1]);
		expect(d.logDecrement).toBeCloseTo(0.6931, 4);
		expect(d.dampingRatio).toBeCloseTo(0.10965, 5);
	});

	it('x0 = 10 and x5 = 2, five cycles apart, give δ = 0.32189, ζ = 0.05116 (domain.md E7 [C])', () => {
		const d = dampingFromPeaksApart(10, 2, 5);
		expect(d.logDecrement).toBeCloseTo(0.32189, 5);
		expect(d.dampingRatio).toBeCloseTo(0.05116, 5);
	});

	it('peak 1 to peak 100 is 99 cycles: 13 % gives δ = 0.020608, not 0.020402 (domain.md E8, [S] physics forum, [C])', () => {
		const d = dampingFromPeakNumbers({ peak: 1, amplitude: 1 }, { peak: 100, amplitude: 0.13 });
		expect(d.logDecrement).toBeCloseTo(0.020608, 6);
		expect(d.logDecrement).not.toBeCloseTo(0.020402, 5);
		expect(d.dampingRatio).toBeCloseTo(0.00328, 6);
	});

	it('recovers ζ from the peaks of a closed-form ring-down, any number of them', () => {
		const z = 0.03;
		const o = oscillatorFromModal({ omega0: 2 * Math.PI * 12, dampingRatio: z });
		const r = freeResponse(o, { x0: 1, v0: 0 });
		const period = 1 / (o.dampedFrequencyHz as number);
		// for x0-only release the peaks fall on t = n·T_d exactly times a constant shift; use envelope samples
		const peaks = Array.from({ length: 12 }, (_, n) => r.displacement(n * period));
		expect(dampingFromLogDecrement(peaks).dampingRatio).toBeCloseTo(z, 10);
	});

	it('ζ ↔ δ are exact inverses', () => {
		for (const z of [0, 0.001, 0.05, 0.3, 0.9])
			expect(dampingRatioFromLogDecrement(logDecrementFromDampingRatio(z))).toBeCloseTo(z, 12);
		expect(() => logDecrementFromDampingRatio(1)).toThrow(/underdamped/);
	});

	it('refuses peaks that do not decay or are not positive, and bad peak numbers', () => {
		expect(() => dampingFromLogDecrement([1, 2, 3])).toThrow(/decaying/);
		expect(() => dampingFromLogDecrement([1])).toThrow(/at least two/);
		expect(() => dampingFromLogDecrement([])).toThrow(/non-empty/);
		expect(() => dampingFromLogDecrement([1, -0.5])).toThrow(
			/peaks\[1\] must be greater than zero/
		);
		expect(() => dampingFromPeaksApart(1, 2, 3)).toThrow(/later peak/);
		expect(() => dampingFromPeaksApart(2, 1, 0)).toThrow(/cycles/);
		expect(() =>
			dampingFromPeakNumbers({ peak: 5, amplitude: 1 }, { peak: 5, amplitude: 0.5 })
		).toThrow(/greater than the first peak number/);
	});
});

describe('half-power bandwidth and amplification factor', () => {
	it('f_n = 50, f1 = 49, f2 = 51 Hz gives ζ = 0.02, Q = AF = 25 (domain.md E10 [C])', () => {
		const d = dampingFromHalfPower(50, 49, 51);
		expect(d.dampingRatio).toBeCloseTo(0.02, 12);
		expect(d.qFactor).toBeCloseTo(25, 12);
		expect(amplificationFactorFromDamping(0.02)).toBeCloseTo(25, 12);
		expect(dampingFromAmplificationFactor(25)).toBeCloseTo(0.02, 12);
	});

	it('on the exact SDOF curve with ζ = 0.05 the half-power points are r = 0.94611 and 1.04636, AF = 9.950 (domain.md E11 [C])', () => {
		const z = 0.05;
		const rPeak = Math.sqrt(1 - 2 * z * z);
		const half = (peakMagnification(z) as number) / Math.SQRT2;
		const r1 = bisect((r) => magnification(r, z) - half, 0.8, rPeak);
		const r2 = bisect((r) => magnification(r, z) - half, rPeak, 1.2);
		expect(r1).toBeCloseTo(0.94611, 5);
		expect(r2).toBeCloseTo(1.04636, 5);
		expect(dampingFromHalfPower(rPeak, r1, r2).qFactor).toBeCloseTo(9.95, 3);
	});

	it('refuses half-power points on one side of the peak', () => {
		expect(() => dampingFromHalfPower(50, 51, 52)).toThrow(/on either side of the peak/);
		expect(() => amplificationFactorFromDamping(0)).toThrow(
			/dampingRatio must be greater than zero/
		);
	});
});

describe('half-power damping, exact for the response measured', () => {
	/** |H|², |Y|², |A|² of the SDOF at r = f/f_n (receptance, mobility, accelerance; unit k, m). */
	const power = {
		displacement: (r: number, z: number) => 1 / ((1 - r * r) ** 2 + (2 * z * r) ** 2),
		velocity: (r: number, z: number) => (r * r) / ((1 - r * r) ** 2 + (2 * z * r) ** 2),
		acceleration: (r: number, z: number) => r ** 4 / ((1 - r * r) ** 2 + (2 * z * r) ** 2)
	} as const;

	/**
	 * The half-power points of a closed-form FRF found numerically, independent of the formula
	 * under test: the peak by golden section, each crossing of half the peak power by bisection.
	 */
	function halfPowerPoints(g: (r: number) => number): [number, number] | null {
		let a = 0.05;
		let b = 3;
		for (let i = 0; i < 200; i++) {
			const c = b - 0.618 * (b - a);
			const d = a + 0.618 * (b - a);
			if (g(c) > g(d)) b = d;
			else a = c;
		}
		const peak = (a + b) / 2;
		const half = g(peak) / 2;
		const cross = (lo: number, hi: number) => {
			if ((g(lo) - half) * (g(hi) - half) > 0) return null;
			for (let i = 0; i < 200; i++) {
				const m = (lo + hi) / 2;
				if ((g(lo) - half) * (g(m) - half) <= 0) hi = m;
				else lo = m;
			}
			return (lo + hi) / 2;
		};
		const r1 = cross(1e-6, peak);
		const r2 = cross(peak, 50);
		return r1 !== null && r2 !== null ? [r1, r2] : null;
	}

	it('matches the worked example E11 (ζ = 0.05 receptance: r = 0.94611 and 1.04636)', () => {
		// ../shared/domain.md E11, computed from the closed form
		const pts = halfPowerPoints((r) => power.displacement(r, 0.05))!;
		expect(pts[0]).toBeCloseTo(0.94611, 5);
		expect(pts[1]).toBeCloseTo(1.04636, 5);
		const e = halfPowerExact(pts[0], pts[1], 'displacement');
		expect(e.dampingRatio).toBeCloseTo(0.05, 9);
		expect(e.naturalHz).toBeCloseTo(1, 9);
	});

	it.each(['displacement', 'velocity', 'acceleration'] as const)(
		'recovers ζ and f_n of the closed-form %s FRF up to ζ = 0.35, where ζ ≈ Δf/2f reads high',
		(kind) => {
			const fn = 37.5;
			for (const z of [0.005, 0.02, 0.1, 0.2, 0.3, 0.35]) {
				const pts = halfPowerPoints((r) => power[kind](r, z))!;
				const e = halfPowerExact(fn * pts[0], fn * pts[1], kind);
				expect(Math.abs(e.dampingRatio - z) / z, `ζ ${z}`).toBeLessThan(1e-6);
				expect(Math.abs(e.naturalHz - fn) / fn, `f_n at ζ ${z}`).toBeLessThan(1e-6);
				if (kind !== 'velocity' && z >= 0.3) {
					// the approximation from the peak is off by more than 10 % here
					const peakR =
						kind === 'displacement' ? Math.sqrt(1 - 2 * z * z) : 1 / Math.sqrt(1 - 2 * z * z);
					expect((pts[1] - pts[0]) / (2 * peakR) / z - 1).toBeGreaterThan(0.1);
				}
			}
		}
	);

	it('has no lower half-power point on a receptance above ζ ≈ 0.383', () => {
		expect(halfPowerPoints((r) => power.displacement(r, 0.38))).not.toBeNull();
		expect(halfPowerPoints((r) => power.displacement(r, 0.39))).toBeNull();
	});
});
