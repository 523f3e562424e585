import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/svelte';
import BandsPanel from './BandsPanel.svelte';
import { avoidanceBands, modeRemedies } from '$lib/vibration';

// a pump at 1,480 rpm fixed speed, 1× shaft, ±10 %: a mode at 24.2 Hz sits on 1× (24.67 Hz)
const input = {
	speedRange: { minRpm: 1480, maxRpm: 1480 },
	measuredRpm: 1480,
	sources: [{ id: 's', kind: 'shaft' as const, orders: [1] }],
	modes: [{ frequencyHz: 24.2 }, { frequencyHz: 60 }],
	rule: { kind: 'fixed' as const, percent: 10 }
};

describe('BandsPanel (asset sheet and Floor check)', () => {
	it('rounds changes as a person writes them and calls one past ±50 % a redesign', () => {
		render(BandsPanel, { plan: avoidanceBands(input), remedies: modeRemedies(input) });
		const text = screen.getByTestId('remedies').textContent ?? '';
		// raise 24.2 → 27.14 Hz: stiffness +26 %, mass −20 %; lower to 22.2 Hz: stiffness −16 %,
		// mass +19 %: all field changes
		expect(text).toMatch(/raise to 27\.1 Hz — stiffness \+26 % or mass −20 %/);
		expect(text).not.toMatch(/\d\.\d{2,} %/);
		expect(text).not.toMatch(/redesign, not a field fix\)/);
		expect(text).toMatch(/60\.00 Hz.*clear/);
	});

	it('marks a remedy beyond a field change', () => {
		// a mode at 12 Hz under a 2×-to-6× comb of a wide-range drive: out of reach by bracing
		const wide = {
			...input,
			speedRange: { minRpm: 300, maxRpm: 1800 },
			sources: [{ id: 's', kind: 'shaft' as const, orders: [1, 2] }],
			modes: [{ frequencyHz: 12 }]
		};
		render(BandsPanel, { plan: avoidanceBands(wide), remedies: modeRemedies(wide) });
		expect(screen.getByTestId('remedies').textContent).toMatch(/a redesign, not a field fix/);
	});
});
