import { describe, expect, it } from 'vitest';
import {
	bandMarginPct,
	evaluateCheck,
	isStale,
	pairVerdict,
	requiredMarginPct,
	separationMarginPct,
	supportClass,
	worseVerdict,
	type CheckInput
} from './index.ts';

describe('separation margin', () => {
	it('f_n = 24 Hz against f_e = 29.6 Hz is 18.9 % of the excitation, not 23.3 % of f_n (domain.md §1.1 [C], common practice)', () => {
		expect(separationMarginPct(24, 29.6)).toBeCloseTo(18.92, 2);
		expect((Math.abs(24 - 29.6) / 24) * 100).toBeCloseTo(23.33, 2); // the other convention, for contrast
	});

	it('is zero inside a swept band and measured to the nearest edge outside it (domain.md §1.1 [P])', () => {
		expect(bandMarginPct(24, 15, 30)).toEqual({ marginPct: 0, position: 'inside' });
		expect(bandMarginPct(12, 15, 30)).toEqual({ marginPct: 20, position: 'below' });
		expect(bandMarginPct(36, 15, 30).marginPct).toBeCloseTo(20, 12);
		expect(bandMarginPct(36, 15, 30).position).toBe('above');
		expect(() => bandMarginPct(10, 30, 15)).toThrow(/band high/);
		expect(() => separationMarginPct(10, 0)).toThrow(/excitationHz must be greater than zero/);
	});
});

describe('required margin', () => {
	it('fixed rule: 10 % by default, per excitation kind when given (common practice, domain.md §1.5)', () => {
		const rule = { kind: 'fixed' as const, percent: 10, perKind: { vane: 15 } };
		expect(requiredMarginPct(rule, { position: 'below' })).toBe(10);
		expect(requiredMarginPct(rule, { position: 'above', excitationKind: 'shaft' })).toBe(10);
		expect(requiredMarginPct(rule, { position: 'above', excitationKind: 'vane' })).toBe(15);
	});

	it.each([
		// domain.md §1.2 check values [C] from the API RP 684 formulas [S2]
		[2.0, 0, 0],
		[2.5, 0, 10],
		[3, 5.667, 15.667],
		[5, 12.143, 22.143],
		[8, 14.385, 24.385],
		[10, 15.0, 25.0],
		[12, 15.381, 25.381],
		[18.5, 16, 26],
		[25, 16, 26]
	])(
		'amplification rule, AF = %s: %s %% below, %s %% above (API RP 684 style; domain.md §1.2)',
		(af, below, above) => {
			const rule = { kind: 'amplification' as const };
			expect(requiredMarginPct(rule, { amplificationFactor: af, position: 'below' })).toBeCloseTo(
				below,
				3
			);
			expect(requiredMarginPct(rule, { amplificationFactor: af, position: 'above' })).toBeCloseTo(
				above,
				3
			);
		}
	);

	it('AF from the half-power method: N_c 3000, N1 2900, N2 3150 rpm gives AF 12 and 15.38 % / 25.38 % (domain.md §1.2 worked case [C])', () => {
		const af = 3000 / (3150 - 2900);
		expect(af).toBe(12);
		expect(
			requiredMarginPct({ kind: 'amplification' }, { amplificationFactor: af, position: 'below' })
		).toBeCloseTo(15.38, 2);
		expect(
			requiredMarginPct({ kind: 'amplification' }, { amplificationFactor: af, position: 'above' })
		).toBeCloseTo(25.38, 2);
	});

	it('amplification rule with no damping measured falls back to the caps; a crossed mode takes the stricter side', () => {
		expect(
			requiredMarginPct({ kind: 'amplification' }, { amplificationFactor: null, position: 'below' })
		).toBe(16);
		expect(requiredMarginPct({ kind: 'amplification' }, { position: 'above' })).toBe(26);
		expect(
			requiredMarginPct({ kind: 'amplification' }, { amplificationFactor: 5, position: 'inside' })
		).toBeCloseTo(22.143, 3);
	});

	it('refuses unknown rule kinds and positions', () => {
		expect(() => requiredMarginPct({ kind: 'vibes' } as never, { position: 'below' })).toThrow(
			/rule kind must be fixed or amplification/
		);
		expect(() =>
			requiredMarginPct({ kind: 'fixed', percent: 10 }, { position: 'left' as never })
		).toThrow(/position/);
		expect(() => requiredMarginPct({ kind: 'fixed', percent: -1 }, { position: 'below' })).toThrow(
			/rule percent must be zero or more/
		);
	});
});

describe('verdicts', () => {
	it('clear at SM ≥ R, tight at R/2 ≤ SM < R, conflict below R/2 (product design)', () => {
		expect(pairVerdict(10, 10)).toBe('clear');
		expect(pairVerdict(9.99, 10)).toBe('tight');
		expect(pairVerdict(5, 10)).toBe('tight');
		expect(pairVerdict(4.99, 10)).toBe('conflict');
		expect(pairVerdict(0, 0)).toBe('clear');
		expect(worseVerdict('clear', 'conflict')).toBe('conflict');
		expect(worseVerdict('tight', 'clear')).toBe('tight');
	});

	it('support is rigid when the lowest natural frequency is ≥ 1.25 × the main excitation (ISO 10816-3, domain.md §1.4 [S2])', () => {
		expect(supportClass(37.5, 30)).toBe('rigid');
		expect(supportClass(37.4, 30)).toBe('flexible');
	});

	it('a check older than the recheck interval is stale', () => {
		const day = 86_400_000;
		expect(isStale(0, 91 * day, 90)).toBe(true);
		expect(isStale(0, 89 * day, 90)).toBe(false);
	});
});

describe('evaluating a check', () => {
	const pump: CheckInput = {
		speedRange: { minRpm: 900, maxRpm: 1800 },
		measuredRpm: 1200,
		sources: [
			{ id: 'shaft', kind: 'shaft', orders: [1, 2] },
			{ id: 'imp', kind: 'vane', count: 5, harmonics: [1] }
		],
		modes: [{ frequencyHz: 24 }, { frequencyHz: 61, dampingRatio: 0.04 }],
		rule: { kind: 'fixed', percent: 10 }
	};

	it('gives every mode × line pair at speed and over the range; a mode the 1× sweeps across is a conflict', () => {
		const r = evaluateCheck(pump);
		expect(r.lines).toHaveLength(3);
		expect(r.pairs).toHaveLength(6);
		const p = r.pairs.find((x) => x.modeIndex === 0 && x.lineId === 'shaft:1×')!;
		expect(p.excitationHz).toBe(20);
		expect(p.marginAtSpeedPct).toBeCloseTo(20, 12); // |24 − 20| / 20
		expect(p.verdictAtSpeed).toBe('clear');
		expect(p.bandHz).toEqual([15, 30]);
		expect(p.marginOverRangePct).toBe(0);
		expect(p.verdictOverRange).toBe('conflict');
		expect(r.verdict).toBe('conflict');
		expect(r.worstOverRange?.marginOverRangePct).toBe(0);
		expect(r.convention).toMatch(/relative to excitation/);
	});

	it('is worst at speed where a line sits on a mode at the measured speed', () => {
		// 2× at 1830 rpm = 61 Hz, right on the second mode
		const r = evaluateCheck({ ...pump, measuredRpm: 1830 });
		expect(r.measuredOutsideRange).toBe(true);
		expect(r.envelope).toEqual({ minRpm: 900, maxRpm: 1830 });
		expect(r.verdictAtSpeed).toBe('conflict');
		expect(r.worstAtSpeed?.lineId).toBe('shaft:2×');
		expect(r.worstAtSpeed?.marginAtSpeedPct).toBeCloseTo(0, 12);
	});

	it('is unchecked with no modes, and has no at-speed verdict without a measured speed', () => {
		expect(evaluateCheck({ ...pump, modes: [] }).verdict).toBe('unchecked');
		const r = evaluateCheck({ ...pump, measuredRpm: null });
		expect(r.verdictAtSpeed).toBe('unchecked');
		expect(r.pairs[0].marginAtSpeedPct).toBeNull();
		expect(r.worstAtSpeed).toBeNull();
	});

	it('uses the mode damping under an amplification rule', () => {
		const r = evaluateCheck({ ...pump, rule: { kind: 'amplification' } });
		const p = r.pairs.find((x) => x.modeIndex === 1 && x.lineId === 'shaft:2×')!;
		// ζ = 0.04 → AF 12.5; the mode (61 Hz) is above the 2× band (30–60 Hz)
		expect(p.positionOverRange).toBe('above');
		expect(p.requiredOverRangePct).toBeCloseTo(10 + 17 * (1 - 1 / 11), 9);
	});

	it('refuses bad checks with a message naming the field', () => {
		expect(() => evaluateCheck({ ...pump, speedRange: { minRpm: 2000, maxRpm: 1000 } })).toThrow(
			/maxRpm must be at least minRpm/
		);
		expect(() => evaluateCheck({ ...pump, modes: [{ frequencyHz: -3 }] })).toThrow(
			/modes\[0\]\.frequencyHz must be greater than zero/
		);
		expect(() => evaluateCheck({ ...pump, modes: [{ frequencyHz: 3, dampingRatio: 0 }] })).toThrow(
			/modes\[0\]\.dampingRatio/
		);
		expect(() => evaluateCheck({ ...pump, measuredRpm: NaN })).toThrow(
			/measuredRpm must be a finite number/
		);
		expect(() => evaluateCheck({ ...pump, modes: 'x' as never })).toThrow(/modes must be a list/);
	});
});

describe('which rule governs which excitation (domain.md §1.2 API 684, §1.3 API 610)', () => {
	const amp = { kind: 'amplification' as const };
	const pump: CheckInput = {
		speedRange: { minRpm: 900, maxRpm: 1500 },
		measuredRpm: 1200,
		sources: [
			{ id: 's', kind: 'shaft', orders: [1] },
			{ id: 'v', kind: 'vane', count: 5 }
		],
		// a lightly damped housing mode just above the vane-pass band (5 × 25 Hz = 125 Hz at 1,500 rpm)
		modes: [{ frequencyHz: 131, dampingRatio: 0.25 }],
		rule: amp
	};

	it('applies the amplification rule to running-speed orders and a fixed margin to the rest', () => {
		// AF = 1/(2ζ) = 2 < 2.5: the API 684 reading asks no margin of a rotor critical ...
		expect(
			requiredMarginPct(amp, { amplificationFactor: 2, position: 'above', excitationKind: 'shaft' })
		).toBe(0);
		// ... but the first version applied it to vane pass too; API 610's structural figure is 10 %
		expect(
			requiredMarginPct(amp, { amplificationFactor: 2, position: 'above', excitationKind: 'vane' })
		).toBe(10);
		expect(
			requiredMarginPct(
				{ kind: 'amplification', percent: 20, perKind: { bearing: 15 } },
				{ amplificationFactor: 40, position: 'below', excitationKind: 'bearing' }
			)
		).toBe(15);
		const r = evaluateCheck(pump);
		const vane = r.pairs.find((p) => p.kind === 'vane')!;
		// 131 Hz is 4.8 % above 125 Hz: under 10 %, not "clear"
		expect(vane.marginOverRangePct).toBeCloseTo(((131 - 125) / 125) * 100, 9);
		expect(vane.requiredOverRangePct).toBe(10);
		expect(vane.verdictOverRange).not.toBe('clear');
	});

	it('says so when a line sweeps across a mode that the rule lets pass (AF below 2.5)', () => {
		const crossed = evaluateCheck({
			...pump,
			sources: [{ id: 's', kind: 'shaft', orders: [1] }],
			modes: [{ frequencyHz: 20, dampingRatio: 0.25 }] // 1,200 rpm: inside 15–25 Hz
		});
		const [p] = crossed.pairs;
		expect(p.positionOverRange).toBe('inside');
		expect(p.verdictOverRange).toBe('clear');
		expect(p.remark).toMatch(/sweeps across this mode; the rule asks no margin/);
		const fixed = evaluateCheck({ ...pump, rule: { kind: 'fixed', percent: 10 } });
		expect(fixed.pairs.every((q) => q.remark === null)).toBe(true);
	});
});
