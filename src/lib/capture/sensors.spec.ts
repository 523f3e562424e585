import { describe, expect, it } from 'vitest';
import {
	calibratedSensitivity,
	describeSensitivity,
	fullScalePerUnit,
	rangeOf,
	sensorSchema
} from './sensors.ts';
import { readTone } from './calibration.ts';
import { noise } from '../../../tests/support/tap-signal.ts';

describe('sensitivity arithmetic (a worked example by hand)', () => {
	// By hand: a 100 mV/g accelerometer into an interface whose full scale is ±2 V peak.
	// 1 g → 0.1 V → 0.1 / 2 = 0.05 of full scale; full scale is 2 V / 0.1 V/g = 20 g.
	// The same interface as a 24-bit converter: 0.05 × 2²³ = 0.05 × 8 388 608 = 419 430.4 counts/g.
	it('turns mV/g and full-scale volts into full scale per g, and back', () => {
		const s = { mode: 'mV' as const, mvPerUnit: 100, fullScaleV: 2 };
		expect(fullScalePerUnit(s)).toBeCloseTo(0.05, 12);
		expect(rangeOf(s)).toBeCloseTo(20, 10);
		expect(describeSensitivity(s, 'accelerometer')).toBe('100 mV/g into ±2 V');
	});

	it('reads counts per g against the converter’s bits', () => {
		const s = { mode: 'counts' as const, countsPerUnit: 419_430.4, bits: 24 as const };
		expect(fullScalePerUnit(s)).toBeCloseTo(0.05, 12);
		expect(describeSensitivity(s, 'accelerometer')).toBe('419400 counts/g (24-bit)');
	});

	it('sets the sensitivity from a calibrator: 0.05 full scale r.m.s. on 1 g r.m.s. gives 100 mV/g', () => {
		const mv = calibratedSensitivity(0.05, 1, { mode: 'mV', mvPerUnit: 93, fullScaleV: 2 });
		expect(mv).toEqual({ mode: 'mV', mvPerUnit: expect.closeTo(100, 9), fullScaleV: 2 });
		const counts = calibratedSensitivity(0.05, 1, { mode: 'counts', countsPerUnit: 1, bits: 24 });
		expect(counts.mode === 'counts' && counts.countsPerUnit).toBeCloseTo(419_430.4, 6);
		// a calibrator at 10 m/s² ≈ 1.02 g r.m.s.: the reference level typed from its certificate
		const typed = calibratedSensitivity(0.051, 1.02, { mode: 'mV', mvPerUnit: 1, fullScaleV: 2 });
		expect(typed.mode === 'mV' && typed.mvPerUnit).toBeCloseTo(100, 9);
		expect(() => calibratedSensitivity(0, 1, mv)).toThrow(/read nothing/);
	});

	it('refuses a sensor without a name or with a sensitivity of zero', () => {
		const base = {
			id: 'a',
			name: 'A-113',
			kind: 'accelerometer',
			sensitivity: { mode: 'mV', mvPerUnit: 100, fullScaleV: 2 },
			calibratedAt: null
		};
		expect(sensorSchema.safeParse(base).success).toBe(true);
		expect(sensorSchema.safeParse({ ...base, name: ' ' }).error?.issues[0].message).toMatch(/name/);
		expect(
			sensorSchema.safeParse({ ...base, sensitivity: { mode: 'mV', mvPerUnit: 0, fullScaleV: 2 } })
				.error?.issues[0].message
		).toMatch(/greater than zero/);
	});
});

describe('reading a calibrator’s tone', () => {
	// a sine of amplitude A has r.m.s. A/√2 (handbook); the reading must not depend on where the
	// tone falls between FFT bins, and noise outside the ±5 % band must not count
	const fs = 44100;
	const tone = (hz: number, rms: number, seconds = 2, noiseFs = 0) => {
		const r = noise(5);
		return Float32Array.from(
			{ length: Math.round(seconds * fs) },
			(_, i) => rms * Math.SQRT2 * Math.sin(2 * Math.PI * hz * (i / fs)) + noiseFs * r()
		);
	};

	it('reads 0.05 full scale r.m.s. at 159.2 Hz within 0.5 %, with broadband noise', () => {
		const t = readTone(tone(159.2, 0.05, 2, 0.02), fs, 159.2);
		expect(Math.abs(t.rms - 0.05) / 0.05).toBeLessThan(0.005);
		expect(Math.abs(t.frequencyHz - 159.2)).toBeLessThan(0.2);
	});

	it('reads a calibrator 1 % off its nominal frequency just as well', () => {
		const t = readTone(tone(160.8, 0.05), fs, 159.2);
		expect(Math.abs(t.rms - 0.05) / 0.05).toBeLessThan(0.005);
		expect(Math.abs(t.frequencyHz - 160.8)).toBeLessThan(0.2);
		expect(t.purity).toBeGreaterThan(0.99);
	});

	it('says when the input is not a clean tone (purity) and when it is too short', () => {
		const t = readTone(tone(50, 0.05), fs, 159.2);
		expect(t.purity).toBeLessThan(0.05);
		expect(() => readTone(new Float32Array(1000), fs, 159.2)).toThrow(/tenth of a second/);
	});
});
