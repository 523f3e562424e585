import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { findPeaks } from './peaks.ts';

/**
 * Prominence as scipy.signal.peak_prominences defines it, written out the slow way: from the peak,
 * go each way to the first strictly higher sample (or the end); the base on that side is the
 * lowest sample passed; the prominence is the height above the higher base.
 */
function bruteProminence(x: number[], k: number): number {
	let left = x[k];
	for (let i = k - 1; i >= 0 && x[i] <= x[k]; i--) left = Math.min(left, x[i]);
	let right = x[k];
	for (let i = k + 1; i < x.length && x[i] <= x[k]; i++) right = Math.min(right, x[i]);
	return x[k] - Math.max(left, right);
}

describe('peak prominence', () => {
	// both ways findPeaks works — a walk for a few candidates, monotonic stacks for many — against
	// the definition
	it.each([
		['many candidates (noise)', 0],
		['a few peaks over a floor', 1]
	])('matches the scipy definition: %s', (_, sparse) => {
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: 0, max: 1000 }), { minLength: 8, maxLength: 300 }),
				(raw) => {
					const x = sparse ? raw.map((v) => (v > 900 ? v : 0)) : raw;
					const peaks = findPeaks(x, 1, x.length - 1, 1);
					for (const p of peaks) expect(p.prominence).toBe(bruteProminence(x, p.bin));
					const expected = x.filter(
						(v, k) => k >= 1 && k < x.length - 1 && v >= 1 && v > x[k - 1] && v >= x[k + 1]
					).length;
					expect(peaks).toHaveLength(expected);
				}
			),
			{ numRuns: 300 }
		);
	});
});
