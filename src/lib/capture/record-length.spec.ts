import { describe, expect, it } from 'vitest';
import { suggestRecordLength } from './record-length.ts';

describe('the record length offered', () => {
	it('covers six time constants of the lowest mode (the worked example of ../shared/domain.md §6.1)', () => {
		// f_n = 20 Hz, ζ = 0.02: τ = 1/(0.02 · 2π · 20) = 0.398 s, six of them 2.39 s → 3 s offered
		const a = suggestRecordLength({
			minRpm: 1500,
			lastCheck: {
				modes: [
					{ frequencyHz: 45, dampingRatio: 0.01 },
					{ frequencyHz: 20, dampingRatio: 0.02 }
				]
			}
		});
		expect(a.seconds).toBe(3);
		expect(a.reason).toMatch(/20\.0 Hz at ζ 0\.020: 2\.4 s/);
	});

	it('without a check, takes 0.8 × the lowest speed and 2 % damping', () => {
		// 900 rpm → 15 Hz × 0.8 = 12 Hz; 6 / (0.02 · 2π · 12) = 3.98 s → 4 s
		const a = suggestRecordLength({ minRpm: 900, lastCheck: null });
		expect(a.seconds).toBe(4);
		expect(a.reason).toMatch(/assumed/);
	});

	it('stops at 16 s for a very low, lightly damped mode', () => {
		expect(
			suggestRecordLength({
				minRpm: 300,
				lastCheck: { modes: [{ frequencyHz: 2, dampingRatio: 0.005 }] }
			}).seconds
		).toBe(16);
	});
});
