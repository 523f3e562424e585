import { describe, expect, it } from 'vitest';
import {
	avoidanceBands,
	evaluateCheck,
	excitationWindowHz,
	excitationCatalogue,
	modeRemedies,
	retuneTo,
	slipFromNameplate,
	type CheckInput
} from './index.ts';

const pump: CheckInput = {
	speedRange: { minRpm: 600, maxRpm: 1800 },
	measuredRpm: 1450,
	sources: [{ id: 's', kind: 'shaft', orders: [1] }],
	modes: [{ frequencyHz: 24 }],
	rule: { kind: 'fixed', percent: 10 }
};

describe('avoidance bands', () => {
	it('maps a 24 Hz structure on a 4-pole direct-drive pump to shaft rpm and drive Hz (domain.md §6.3 example [C])', () => {
		const plan = avoidanceBands(pump, { poles: 4, motorRpmPerShaftRpm: 1 });
		expect(plan.bands).toHaveLength(1);
		const [b] = plan.bands;
		// margin relative to the excitation: f_e ∈ (24/1.1, 24/0.9) Hz. domain.md writes f_n(1 ± SM),
		// the margin relative to f_n, which gives 1296–1584 rpm and 43.2–52.8 Hz.
		expect(b.lowRpm).toBeCloseTo((60 * 24) / 1.1, 9);
		expect(b.highRpm).toBeCloseTo((60 * 24) / 0.9, 9);
		expect(b.driveLowHz).toBeCloseTo(b.lowRpm / 30, 9);
		expect(b.driveHighHz).toBeCloseTo(53.333, 3);
		expect(plan.exports.unit).toBe('Hz');
		expect(plan.exports.lowHigh[0]).toEqual({ low: b.driveLowHz, high: b.driveHighHz });
		expect(plan.exports.centreWidth[0].centre).toBeCloseTo(
			((b.driveLowHz as number) + (b.driveHighHz as number)) / 2,
			12
		);
		expect(plan.exports.startWidth[0].start).toBe(b.driveLowHz);
		expect(plan.exports.startWidth[0].width).toBeCloseTo(plan.exports.centreWidth[0].width, 12);
		expect(plan.speedLimits.lowerMaxRpmTo).toBeCloseTo(b.lowRpm, 9);
		expect(plan.speedLimits.raiseMinRpmTo).toBeCloseTo(b.highRpm, 9);
		expect(plan.slipNote).toMatch(/slip/);
	});

	it('puts a belt or gear ratio between shaft and motor rpm', () => {
		const plan = avoidanceBands(pump, { poles: 4, motorRpmPerShaftRpm: 2 });
		expect(plan.bands[0].motorLowRpm).toBeCloseTo(2 * plan.bands[0].lowRpm, 9);
		expect(plan.bands[0].driveLowHz).toBeCloseTo((2 * plan.bands[0].lowRpm * 4) / 120, 9);
		const noPoles = avoidanceBands(pump);
		expect(noPoles.bands[0].driveLowHz).toBeNull();
		expect(noPoles.exports.unit).toBe('rpm');
	});

	it('puts the API minimum speed for a critical at 3000 cpm with AF 12 at 3000/(1 − 0.1538) rpm (domain.md §1.2 worked case, margin relative to N_min)', () => {
		const plan = avoidanceBands({
			speedRange: { minRpm: 3100, maxRpm: 4000 },
			measuredRpm: null,
			sources: [{ id: 's', kind: 'shaft', orders: [1] }],
			modes: [{ frequencyHz: 50, dampingRatio: 1 / 24 }],
			rule: { kind: 'amplification' }
		});
		expect(plan.bands[0].lowRpm).toBe(3100);
		const sm = 17 * (1 - 1 / (12 - 1.5));
		expect(plan.bands[0].highRpm).toBeCloseTo(3000 / (1 - sm / 100), 6);
		expect(plan.bands[0].highRpm).toBeCloseTo(3545.3, 1);
	});

	it('merges overlapping bands, clips them to the range, and warns when the drive has too few skip slots', () => {
		const input: CheckInput = {
			...pump,
			sources: [{ id: 's', kind: 'shaft', orders: [1, 2, 3] }],
			modes: [{ frequencyHz: 24 }, { frequencyHz: 25 }, { frequencyHz: 58 }]
		};
		const plan = avoidanceBands(input, { skipBands: 2 });
		for (let i = 1; i < plan.bands.length; i++)
			expect(plan.bands[i].lowRpm).toBeGreaterThan(plan.bands[i - 1].highRpm);
		for (const b of plan.bands) {
			expect(b.lowRpm).toBeGreaterThanOrEqual(600);
			expect(b.highRpm).toBeLessThanOrEqual(1800);
		}
		// 24 and 25 Hz under 1× overlap into one band caused by both modes
		const first = plan.bands.find((b) =>
			b.causes.some((c) => c.modeIndex === 0 && c.lineId === 's:1×')
		)!;
		expect(first.causes.some((c) => c.modeIndex === 1 && c.lineId === 's:1×')).toBe(true);
		expect(plan.bands.length).toBeGreaterThan(2);
		expect(plan.tooMany).toBe(true);
		expect(plan.warnings[0]).toMatch(/avoidance bands but the drive takes 2/);
		expect(plan.warnings[0]).toMatch(/detune the structure/);
	});

	it('says when no speed is clear and when a fixed-frequency line cannot be avoided by speed', () => {
		const plan = avoidanceBands({
			speedRange: { minRpm: 1400, maxRpm: 1500 },
			measuredRpm: 1450,
			sources: [
				{ id: 's', kind: 'shaft', orders: [1] },
				{ id: 'l', kind: 'line', lineFrequencyHz: 50 }
			],
			modes: [{ frequencyHz: 24 }, { frequencyHz: 98 }],
			rule: { kind: 'fixed', percent: 10 }
		});
		expect(plan.noClearSpeed).toBe(true);
		expect(plan.unavoidable).toHaveLength(1);
		expect(plan.unavoidable[0].label).toBe('2× line');
		expect(plan.warnings.join(' ')).toMatch(/No speed in the range is clear/);
		expect(plan.warnings.join(' ')).toMatch(/only detuning helps/);
	});

	it('gives a fixed-speed machine inside its window a zero-width band', () => {
		const plan = avoidanceBands({ ...pump, speedRange: { minRpm: 1450, maxRpm: 1450 } });
		expect(plan.bands).toHaveLength(1);
		expect(plan.bands[0].lowRpm).toBe(1450);
		expect(plan.bands[0].highRpm).toBe(1450);
	});

	it('handles a required margin of 100 % or more as an open-ended window', () => {
		expect(excitationWindowHz(10, 1, 0.1)[1]).toBe(Infinity);
	});
});

describe('slip and poles (motor nameplate arithmetic, common practice)', () => {
	it('derives the slip from the nameplate: 4 poles, 60 Hz, 1,780 rpm → 1.11 % (domain.md §5, induction motors)', () => {
		// n_sync = 120 · 60 / 4 = 1,800 rpm; s = 20 / 1,800; slip frequency s · 60 = 0.667 Hz
		const s = slipFromNameplate(1780, 4, 60);
		expect(s).toBeCloseTo(20 / 1800, 12);
		expect(s * 60).toBeCloseTo(0.667, 3);
		expect(() => slipFromNameplate(1800, 4, 60)).toThrow(/below the synchronous 1800 rpm/);
	});

	it('puts 2× line of a drive at twice its output frequency, slip included', () => {
		// the first version used motor rpm × p / 120 with no slip: 1.1 % low here. At 1,780 rpm on
		// a 4-pole motor with 1.11 % slip the drive puts out 60 Hz, so 2× line is 120 Hz.
		const s = 20 / 1800;
		const [line] = excitationCatalogue([
			{
				id: 'l',
				kind: 'line',
				lineFrequencyHz: 60,
				drive: { poles: 4, motorRpmPerShaftRpm: 1, slip: s }
			}
		]);
		expect(((line.order as number) * 1780) / 60).toBeCloseTo(120, 9);
		const [synchronous] = excitationCatalogue([
			{ id: 'l', kind: 'line', lineFrequencyHz: 60, drive: { poles: 4, motorRpmPerShaftRpm: 1 } }
		]);
		expect(((synchronous.order as number) * 1780) / 60).toBeCloseTo(118.67, 2);
	});

	it('gives drive Hz with the slip: f = p · n / (120 (1 − s))', () => {
		const plan = avoidanceBands(pump, { poles: 4, motorRpmPerShaftRpm: 1, slip: 0.02 });
		const [b] = plan.bands;
		expect(b.driveLowHz).toBeCloseTo((b.lowRpm * 4) / (120 * 0.98), 9);
		expect(plan.slipNote).toMatch(/include the motor’s slip of 2 %/);
	});

	it('refuses an odd pole count and an impossible slip', () => {
		expect(() => avoidanceBands(pump, { poles: 3 })).toThrow(/even number/);
		expect(() =>
			excitationCatalogue([
				{ id: 'l', kind: 'line', lineFrequencyHz: 50, drive: { poles: 5, motorRpmPerShaftRpm: 1 } }
			])
		).toThrow(/even number/);
		expect(() => avoidanceBands(pump, { poles: 4, slip: 0.5 })).toThrow(/slip/);
	});
});

describe('remedies', () => {
	const input: CheckInput = {
		speedRange: { minRpm: 900, maxRpm: 1800 },
		measuredRpm: 1200,
		sources: [{ id: 's', kind: 'shaft', orders: [1] }],
		modes: [{ frequencyHz: 24 }, { frequencyHz: 60 }],
		rule: { kind: 'fixed', percent: 10 }
	};

	it('moves a crossed mode to the nearest clear frequency by stiffness (f ∝ √k) or mass (f ∝ 1/√m)', () => {
		const [crossed, clear] = modeRemedies(input);
		expect(clear.clear).toBe(true);
		expect(crossed.clear).toBe(false);
		// 1× sweeps 15–30 Hz: clear above 30·1.1 = 33 Hz or below 15·0.9 = 13.5 Hz
		expect(crossed.raiseTo!.frequencyHz).toBeCloseTo(33, 6);
		expect(crossed.raiseTo!.stiffnessChangePct).toBeCloseTo(((33 / 24) ** 2 - 1) * 100, 4);
		expect(crossed.lowerTo!.frequencyHz).toBeCloseTo(13.5, 6);
		expect(crossed.lowerTo!.massChangePct).toBeCloseTo(((24 / 13.5) ** 2 - 1) * 100, 4);
		for (const target of [crossed.raiseTo!, crossed.lowerTo!]) {
			const after = evaluateCheck({ ...input, modes: [{ frequencyHz: target.frequencyHz }] });
			expect(after.verdict).toBe('clear');
		}
	});

	it('takes a target margin other than the rule’s', () => {
		const [r] = modeRemedies(input, { targetPct: 20 });
		expect(r.raiseTo!.frequencyHz).toBeCloseTo(36, 6);
		// f ∝ √(k/m): doubling f takes 4× the stiffness or a quarter of the mass
		expect(retuneTo(10, 20)).toEqual({
			frequencyHz: 20,
			stiffnessChangePct: 300,
			massChangePct: -75,
			stiffnessIsRedesign: true,
			massIsRedesign: true
		});
	});

	it('calls a change of more than 50 % a redesign, not a field fix (common practice)', () => {
		// +20 % in frequency: +44 % stiffness (a field change) or −30.6 % mass
		const small = retuneTo(10, 12);
		expect(small.stiffnessChangePct).toBeCloseTo(44, 9);
		expect(small.stiffnessIsRedesign).toBe(false);
		expect(small.massIsRedesign).toBe(false);
		// −30 %: mass +104 % (a redesign) or stiffness −51 % (a redesign too)
		const down = retuneTo(10, 7);
		expect(down.massChangePct).toBeCloseTo(104.08, 2);
		expect(down.massIsRedesign).toBe(true);
		expect(down.stiffnessIsRedesign).toBe(true);
	});
});
