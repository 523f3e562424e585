import { describe, expect, it } from 'vitest';
import * as u from './units.ts';
import { VibrationInputError } from './errors.ts';

// Conversion factors checked against NIST SP 811 (2008), Appendix B.8/B.9 [S]:
// 1 in = 0.0254 m (exact), 1 lb = 0.45359237 kg (exact), 1 lbf = 4.448222 N, 1 lbf/in = 175.1268 N/m.
describe('units', () => {
	it('converts frequency between Hz, CPM, rad/s and rpm', () => {
		expect(u.hzToCpm(29.6)).toBeCloseTo(1776, 9);
		expect(u.cpmToHz(1776)).toBeCloseTo(29.6, 9);
		expect(u.hzToRadPerS(1)).toBeCloseTo(2 * Math.PI, 12);
		expect(u.radPerSToHz(2 * Math.PI)).toBeCloseTo(1, 12);
		expect(u.rpmToHz(1800)).toBe(30);
		expect(u.hzToRpm(30)).toBe(1800);
		for (const unit of ['Hz', 'CPM', 'rad/s'] as const)
			expect(u.frequencyToHz(u.frequencyFromHz(12.5, unit), unit)).toBeCloseTo(12.5, 12);
	});

	it('matches NIST SP 811 for length, mass, stiffness and velocity', () => {
		expect(u.NEWTONS_PER_POUND_FORCE).toBeCloseTo(4.448222, 6);
		expect(u.lbfPerInToNPerM(1)).toBeCloseTo(175.1268, 4);
		expect(u.nPerMToLbfPerIn(175.1268)).toBeCloseTo(1, 6);
		expect(u.inToM(1)).toBe(0.0254);
		expect(u.mToIn(0.0254)).toBeCloseTo(1, 12);
		expect(u.mmToM(25.4)).toBeCloseTo(0.0254, 12);
		expect(u.mToMm(0.0254)).toBeCloseTo(25.4, 12);
		expect(u.lbToKg(1)).toBe(0.45359237);
		expect(u.kgToLb(0.45359237)).toBeCloseTo(1, 12);
		expect(u.inPerSToMmPerS(1)).toBeCloseTo(25.4, 12);
		expect(u.mmPerSToInPerS(25.4)).toBeCloseTo(1, 12);
	});

	it('labels and converts every quantity the forms use, both ways', () => {
		expect(u.unitLabel('stiffness', 'us')).toBe('lbf/in');
		expect(u.unitLabel('smallLength', 'metric')).toBe('mm');
		expect(u.toSi(6, 'smallLength', 'metric')).toBeCloseTo(0.006, 12);
		expect(u.toSi(1, 'modulus', 'us')).toBeCloseTo(6894.757, 3); // 1 psi in Pa (NIST SP 811)
		const qs: u.Quantity[] = [
			'length',
			'smallLength',
			'mass',
			'stiffness',
			'velocity',
			'modulus',
			'inertia',
			'torsionalStiffness',
			'secondMoment'
		];
		for (const q of qs)
			for (const sys of ['metric', 'us'] as const)
				expect(u.fromSi(u.toSi(3.7, q, sys), q, sys)).toBeCloseTo(3.7, 9);
		expect(() => u.toSi(NaN, 'mass', 'us')).toThrow(VibrationInputError);
		expect(() => u.hzToCpm(Infinity)).toThrow(/frequency \(Hz\) must be a finite number/);
	});
});
