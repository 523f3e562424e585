import { describe, expect, it } from 'vitest';
import { linear, pathOf, ticks, unwrap } from './plot-scale.ts';

describe('sweep plot scales', () => {
	it('puts ticks at 1, 2 or 5 × 10ⁿ', () => {
		expect(ticks(0, 3600, 5)).toEqual([0, 1000, 2000, 3000]);
		expect(ticks(2400, 3600, 6)).toEqual([2400, 2600, 2800, 3000, 3200, 3400, 3600]);
		expect(ticks(0, 1, 4)).toEqual([0, 0.5, 1]);
	});
	it('maps linearly and draws a path through the points', () => {
		const m = linear(0, 10, 100, 200);
		expect(m(5)).toBe(150);
		expect(pathOf([0, 1, 2], [3, 4, 5])).toBe('M0.0,3.0L1.0,4.0L2.0,5.0');
	});
	it('unwraps a phase that passes 360°', () => {
		expect(unwrap([350, 355, 5, 15])).toEqual([350, 355, 365, 375]);
		expect(unwrap([370, 10])).toEqual([10, 10]);
	});
});
