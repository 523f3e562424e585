import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { frequency, frequencyNumber, inUnit, pairLabel, toHz } from './frequency.ts';
import { hzToCpm } from './vibration/units.ts';
import { modeText } from './schemas/sync.ts';
import { fieldsFor, formFromParams, paramsFromForm } from './schemas/source-form.ts';
import { describeSource } from './schemas/excitation.ts';

// 1 Hz = 60 CPM by definition (a cycle per second is sixty cycles per minute). Physics with a known
// answer: a shaft at N rpm turns N times a minute, so its 1× line is N CPM; 1,776 rpm is 29.6 Hz.
describe('frequencies in Hz or CPM', () => {
	it('puts 1× running speed at the speed in rpm when read in CPM', () => {
		expect(inUnit(1776 / 60, 'CPM')).toBeCloseTo(1776, 9);
		expect(frequency(1776 / 60, 'CPM')).toBe('1776 CPM');
		expect(frequency(29.6, 'Hz')).toBe('29.60 Hz');
		expect(inUnit(29.6, 'Hz')).toBe(29.6);
	});

	it('agrees with the engine’s own conversion and goes back to the same Hz', () => {
		fc.assert(
			fc.property(fc.double({ min: 0.01, max: 100_000, noNaN: true }), (hz) => {
				expect(inUnit(hz, 'CPM')).toBeCloseTo(hzToCpm(hz), 6);
				expect(toHz(inUnit(hz, 'CPM'), 'CPM')).toBeCloseTo(hz, 9);
				expect(toHz(hz, 'Hz')).toBe(hz);
			})
		);
	});

	it('never writes CPM finer than the Hz figure it stands for, and keeps slow modes readable', () => {
		// 0.01 Hz is 0.6 CPM: two decimals of Hz are whole CPM
		expect(frequencyNumber(24.567, 'CPM')).toBe('1474');
		expect(frequencyNumber(24.567, 'Hz')).toBe('24.57');
		expect(frequencyNumber(24.567, 'Hz', 1)).toBe('24.6');
		// under 60 CPM (a 0.5 Hz tower sway) one decimal is kept rather than 30 → 30
		expect(frequency(0.512, 'CPM')).toBe('30.7 CPM');
		expect(pairLabel(24.6, '2× shaft', 'CPM')).toBe('1476 CPM × 2× shaft');
		expect(pairLabel(24.6, '2× shaft', 'Hz')).toBe('24.60 Hz × 2× shaft');
	});

	it('reads a natural frequency typed in CPM on Floor check into Hz, with the same limits', () => {
		const m = modeText.parse({
			freq: '1 776',
			zeta: '',
			direction: 'horizontal',
			location: '',
			unit: 'CPM'
		});
		expect(m.frequencyHz).toBeCloseTo(29.6, 12);
		const bad = modeText.safeParse({
			freq: 'fast',
			zeta: '',
			direction: '',
			location: '',
			unit: 'CPM'
		});
		expect(bad.success).toBe(false);
		expect(bad.error?.issues[0].message).toBe(
			'Natural frequency: enter a number of cycles per minute greater than zero.'
		);
		// 100 kHz is the limit in either unit: 6,000,060 CPM is over it
		expect(
			modeText.safeParse({ freq: '6000060', zeta: '', direction: '', location: '', unit: 'CPM' })
				.success
		).toBe(false);
		// a form from before the unit existed reads Hz
		expect(
			modeText.parse({ freq: '29.6', zeta: '', direction: '', location: '' }).frequencyHz
		).toBe(29.6);
	});

	it('takes a fixed forcing frequency in CPM on the asset sheet and shows it back in CPM', () => {
		expect(fieldsFor('fixed', 'metric', 'CPM')[0].unit).toBe('CPM');
		expect(fieldsFor('fixed', 'metric', 'Hz')[0].unit).toBe('Hz');
		// the supply's frequency stays in Hz, as the nameplate gives it
		expect(fieldsFor('line', 'metric', 'CPM').find((f) => f.key === 'lineFrequencyHz')?.unit).toBe(
			'Hz'
		);
		const r = paramsFromForm('fixed', { 'p.frequencyHz': '7200' }, 'metric', 'CPM');
		expect(r).toEqual({ ok: true, params: { frequencyHz: 120 } });
		expect(formFromParams('fixed', { frequencyHz: 120 }, 'metric', 'CPM')).toEqual({
			frequencyHz: '7200'
		});
		expect(formFromParams('fixed', { frequencyHz: 120 }, 'metric', 'Hz')).toEqual({
			frequencyHz: '120'
		});
		expect(describeSource('fixed', 'compressor', { frequencyHz: 120 }, 'CPM')).toBe(
			'Fixed frequency “compressor”: 7200 CPM'
		);
	});
});
