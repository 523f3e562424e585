import { describe, expect, it } from 'vitest';
import { overallLevel } from './level.ts';

const FS = 4096;
const tone = (amp: number, f: number, seconds: number) =>
	Float64Array.from({ length: FS * seconds }, (_, i) => amp * Math.sin((2 * Math.PI * f * i) / FS));
const plus = (a: Float64Array, b: Float64Array) => a.map((x, i) => x + b[i]);

describe('overall level of a running record', () => {
	// Physics with a known answer: 0.5 g at 29.5 Hz (running speed of a 1770 rpm motor) is
	// 0.5 · 9.80665 / (2π · 29.5) / √2 m/s = 18.70 mm/s r.m.s.
	it('integrates a channel in g to mm/s r.m.s. over 10–1000 Hz', () => {
		const r = overallLevel({ name: 'acc', unit: 'g', samples: tone(0.5, 29.5, 12) }, FS, 1770);
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		const expected = ((0.5 * 9.80665) / (2 * Math.PI * 29.5) / Math.SQRT2) * 1000;
		expect(Math.abs(r.velocityMmS - expected) / expected).toBeLessThan(0.01);
		expect(r.band).toEqual({ lowHz: 10, highHz: 1000 });
		expect(r.from).toBe('acceleration');
	});

	it('takes a velocity channel as it is, band-limited, and leaves out a 4 Hz sway above 600 rpm', () => {
		const v = plus(tone(4, 50, 12), tone(10, 4, 12)); // mm/s peak
		const r = overallLevel({ name: 'vel', unit: 'mm/s', samples: v }, FS, 1180);
		expect(r.ok && r.velocityMmS).toBeCloseTo(4 / Math.SQRT2, 1);
		// at 400 rpm the band starts at 2 Hz, and the sway counts
		const slow = overallLevel({ name: 'vel', unit: 'mm/s', samples: v }, FS, 400);
		expect(slow.ok && slow.velocityMmS).toBeCloseTo(Math.hypot(4, 10) / Math.SQRT2, 0);
	});

	it('refuses uncalibrated counts and says what a low sample rate or a short record costs', () => {
		const counts = overallLevel({ name: 'ch1', unit: '', samples: tone(1, 30, 2) }, FS, 1180);
		expect(counts).toMatchObject({ ok: false });
		expect(!counts.ok && counts.message).toMatch(/not a calibrated acceleration/);
		const short = Float64Array.from({ length: 500 }, (_, i) =>
			Math.sin((2 * Math.PI * 30 * i) / 1000)
		);
		const low = overallLevel({ name: 'acc', unit: 'm/s²', samples: short }, 1000, 1180);
		expect(low.ok && low.notes.join(' ')).toMatch(/reaches only 450 Hz.*\n?.*0.5 s long/s);
	});
});
