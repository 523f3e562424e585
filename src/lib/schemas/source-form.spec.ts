import { describe, expect, it } from 'vitest';
import { fieldsFor, formFromParams, paramsFromForm } from './source-form.ts';

// 1 in = 25.4 mm exactly (the international inch of 1959, as NIST SP 811 gives it)
describe('excitation-source forms in either unit system', () => {
	const bearingForm = {
		'p.rollingElements': '9',
		'p.elementDiameter': '1',
		'p.pitchDiameter': '4.5',
		'p.contactAngleDeg': '0',
		'p.speedRatio': ''
	};

	it('label lengths mm for metric users and in for US customary users', () => {
		expect(fieldsFor('bearing', 'metric').find((f) => f.key === 'pitchDiameter')?.unit).toBe('mm');
		expect(fieldsFor('bearing', 'us').find((f) => f.key === 'pitchDiameter')?.unit).toBe('in');
		// counts and angles keep their units
		expect(fieldsFor('bearing', 'us').find((f) => f.key === 'contactAngleDeg')?.unit).toBe('°');
	});

	it('store inches as metres, and show them back as the same inches', () => {
		const r = paramsFromForm('bearing', bearingForm, 'us');
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(r.params.elementDiameter).toBeCloseTo(0.0254, 12);
		expect(r.params.pitchDiameter).toBeCloseTo(0.1143, 12);
		expect(formFromParams('bearing', r.params, 'us')).toMatchObject({
			elementDiameter: '1',
			pitchDiameter: '4.5'
		});
		expect(formFromParams('bearing', r.params, 'metric')).toMatchObject({
			elementDiameter: '25.4',
			pitchDiameter: '114.3'
		});
	});

	it('read the same digits as millimetres for a metric user', () => {
		const r = paramsFromForm(
			'bearing',
			{ ...bearingForm, 'p.elementDiameter': '25.4', 'p.pitchDiameter': '114.3' },
			'metric'
		);
		expect(r.ok && r.params.pitchDiameter).toBeCloseTo(0.1143, 12);
	});
});
