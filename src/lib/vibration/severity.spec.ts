import { describe, expect, it } from 'vitest';
import {
	severityBand,
	supportOf,
	velocityRmsFromAcceleration,
	velocityRmsFromVelocity,
	zoneOf,
	zoneRank
} from './severity.ts';
import { DEFAULT_SEVERITY_LIMITS } from '../rules/severity-limits.ts';
import { checkSeverity } from '../checks/severity.ts';

const FS = 5120;
const sine = (amp: number, f: number, seconds = 4, phase = 0.3) =>
	Float64Array.from(
		{ length: FS * seconds },
		(_, i) => amp * Math.sin(2 * Math.PI * f * (i / FS) + phase)
	);
const add = (...xs: Float64Array[]) => xs[0].map((_, i) => xs.reduce((s, x) => s + x[i], 0));

describe('overall velocity from acceleration', () => {
	// Physics with a known answer: a = A sin(2πft) integrates to v = A/(2πf) · (−cos), whose r.m.s.
	// is A/(2πf·√2). 10 m/s² at 50 Hz is 22.508 mm/s r.m.s.
	it.each([15, 50, 160, 800])('a sine at %s Hz: v = a/(2πf), r.m.s. within 1 %', (f) => {
		const expected = (1000 * 10) / (2 * Math.PI * f) / Math.SQRT2;
		const v = velocityRmsFromAcceleration(sine(10, f), FS, { lowHz: 10, highHz: 1000 });
		expect(Math.abs(v - expected) / expected).toBeLessThan(0.01);
	});

	it('adds two tones in quadrature (Parseval)', () => {
		const v1 = (1000 * 4) / (2 * Math.PI * 30) / Math.SQRT2;
		const v2 = (1000 * 20) / (2 * Math.PI * 400) / Math.SQRT2;
		const v = velocityRmsFromAcceleration(add(sine(4, 30), sine(20, 400, 4, 1.1)), FS, {
			lowHz: 10,
			highHz: 1000
		});
		expect(v).toBeCloseTo(Math.hypot(v1, v2), 1);
	});

	// The band edges (ISO 20816-3 measuring range: 10–1000 Hz, or 2–1000 Hz for 120–600 r/min):
	// a 5 Hz tone counts only in the wider band; a 1300 Hz tone in neither.
	it('leaves out what lies outside the band', () => {
		const slow = sine(1, 5, 8);
		const alone = (1000 * 1) / (2 * Math.PI * 5) / Math.SQRT2;
		expect(velocityRmsFromAcceleration(slow, FS, { lowHz: 2, highHz: 1000 })).toBeCloseTo(alone, 0);
		expect(velocityRmsFromAcceleration(slow, FS, { lowHz: 10, highHz: 1000 })).toBeLessThan(
			0.02 * alone
		);
		const fast = sine(50, 1300);
		const fastAlone = (1000 * 50) / (2 * Math.PI * 1300) / Math.SQRT2;
		expect(velocityRmsFromAcceleration(fast, FS, { lowHz: 10, highHz: 1000 })).toBeLessThan(
			0.02 * fastAlone
		);
	});

	it('band-limits a velocity record without integrating it', () => {
		// 5 mm/s peak is 3.536 mm/s r.m.s.
		const v = velocityRmsFromVelocity(sine(0.005, 80), FS, { lowHz: 10, highHz: 1000 });
		expect(v).toBeCloseTo(5 / Math.SQRT2, 2);
	});

	it('refuses a record too short to say anything', () => {
		expect(() =>
			velocityRmsFromAcceleration(new Float64Array(10), FS, { lowHz: 10, highHz: 1000 })
		).toThrow(/at least 64 samples/);
	});
});

describe('zones and support', () => {
	// The shipped limit set: ISO 20816-3:2022 Annex A as quoted by public implementations (see
	// ../shared/domain.md §2); each boundary value belongs to the better zone.
	it.each(DEFAULT_SEVERITY_LIMITS.map((l) => [`${l.machineGroup} ${l.support}`, l] as const))(
		'%s: each boundary in the better zone, just above it in the next',
		(_, l) => {
			expect(zoneOf(0, l)).toBe('A');
			expect(zoneOf(l.abMmS, l)).toBe('A');
			expect(zoneOf(l.abMmS + 0.01, l)).toBe('B');
			expect(zoneOf(l.bcMmS, l)).toBe('B');
			expect(zoneOf(l.bcMmS + 0.01, l)).toBe('C');
			expect(zoneOf(l.cdMmS, l)).toBe('C');
			expect(zoneOf(l.cdMmS + 0.01, l)).toBe('D');
		}
	);

	it('ships the values of the quoted tables', () => {
		const row = (g: string, s: string) =>
			DEFAULT_SEVERITY_LIMITS.find((l) => l.machineGroup === g && l.support === s)!;
		expect(row('group1', 'rigid')).toMatchObject({ abMmS: 2.3, bcMmS: 4.5, cdMmS: 7.1 });
		expect(row('group1', 'flexible')).toMatchObject({ abMmS: 3.5, bcMmS: 7.1, cdMmS: 11 });
		expect(row('group2', 'rigid')).toMatchObject({ abMmS: 1.4, bcMmS: 2.8, cdMmS: 4.5 });
		expect(row('group2', 'flexible')).toMatchObject({ abMmS: 2.3, bcMmS: 4.5, cdMmS: 7.1 });
	});

	it('refuses limits out of order', () => {
		expect(() => zoneOf(1, { abMmS: 3, bcMmS: 2, cdMmS: 5 })).toThrow(/A\/B < B\/C < C\/D/);
		expect(() => zoneOf(-1, { abMmS: 1, bcMmS: 2, cdMmS: 5 })).toThrow(/overall velocity/);
	});

	// ISO 20816-3's support rule (domain.md §1.4): rigid when the lowest natural frequency is at
	// least 25 % above the main excitation, here running speed: 1500 r/min = 25 Hz, limit 31.25 Hz.
	it('calls a support rigid from 1.25 × running speed up, flexible below', () => {
		expect(supportOf([31.25, 80], 25)).toEqual({
			support: 'rigid',
			assumed: false,
			lowestHz: 31.25
		});
		expect(supportOf([80, 31.2], 25).support).toBe('flexible');
		expect(supportOf([], 25)).toEqual({ support: 'rigid', assumed: true, lowestHz: null });
	});

	it('measures slow machines down to 2 Hz', () => {
		expect(severityBand(600)).toMatchObject({ lowHz: 2, highHz: 1000, outOfScope: false });
		expect(severityBand(601)).toMatchObject({ lowHz: 10, highHz: 1000 });
		expect(severityBand(100).outOfScope).toBe(true);
	});

	it('ranks D first and no zone last', () => {
		const zs = [null, 'B', 'D', 'A', 'C'] as const;
		expect([...zs].sort((a, b) => zoneRank(a) - zoneRank(b))).toEqual(['D', 'C', 'B', 'A', null]);
	});

	it('zones a check from its asset’s group, its speed and its modes', () => {
		const asset = { machineGroup: 'group2', minRpm: 720, maxRpm: 1180, nominalRpm: 1180 };
		// 1180 r/min = 19.67 Hz: a 17.2 Hz mode makes the support flexible (B/C 4.5)
		const flexible = checkSeverity(asset, DEFAULT_SEVERITY_LIMITS, 1180, [17.2, 48.5], 4.2);
		expect(flexible).toMatchObject({ status: 'zoned', zone: 'B', support: 'flexible' });
		// with the lowest mode at 30 Hz it is rigid (B/C 2.8): the same level is zone C
		const rigid = checkSeverity(asset, DEFAULT_SEVERITY_LIMITS, 1180, [30, 48.5], 4.2);
		expect(rigid).toMatchObject({ status: 'zoned', zone: 'C', support: 'rigid' });
		expect(
			checkSeverity({ ...asset, machineGroup: null }, DEFAULT_SEVERITY_LIMITS, 1180, [], 1)
		).toMatchObject({
			status: 'no-group'
		});
	});
});
