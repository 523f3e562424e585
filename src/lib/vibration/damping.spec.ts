import { describe, expect, it } from 'vitest';
import {
	amplificationFactorFromDamping,
	dampingFromAmplificationFactor,
	dampingFromHalfPower,
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
