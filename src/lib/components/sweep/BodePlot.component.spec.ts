import { describe, expect, it } from 'vitest';
import { render } from '@testing-library/svelte';
import BodePlot from './BodePlot.svelte';
import PolarPlot from './PolarPlot.svelte';

// a run-up solid and its coast-down dashed: two pieces, each an amplitude and a phase curve
const piece = (dashed: boolean) => ({
	label: dashed ? 'coast-down' : 'run-up',
	rpm: [1000, 1200, 1400, 1600],
	amplitude: [1, 2, 5, 2],
	phaseDeg: [10, 40, 100, 160],
	color: dashed ? 'red' : 'blue',
	dashed
});

describe('the speed-sweep plots draw every piece', () => {
	it('the Bode plot: an amplitude and a phase curve per piece, as SVG, the coast-down dashed', () => {
		const { container } = render(BodePlot, {
			series: [piece(false), piece(true)],
			unit: 'µm',
			label: 'Bode plot'
		});
		const curves = [...container.querySelectorAll('path[stroke="blue"], path[stroke="red"]')];
		expect(curves).toHaveLength(4);
		for (const c of curves) expect(c.namespaceURI).toBe('http://www.w3.org/2000/svg');
		expect(curves.filter((c) => c.getAttribute('stroke-dasharray') === '6 4')).toHaveLength(2);
		expect(
			curves.every((c) => /^M[\d.]+,[\d.]+(L[\d.]+,[\d.]+){3}$/.test(c.getAttribute('d') ?? ''))
		).toBe(true);
	});

	it('the polar plot: one curve per piece', () => {
		const { container } = render(PolarPlot, {
			series: [piece(false), piece(true)],
			unit: 'µm',
			label: 'Polar plot'
		});
		const curves = [...container.querySelectorAll('path[stroke="blue"], path[stroke="red"]')];
		expect(curves).toHaveLength(2);
		expect(curves[1].getAttribute('stroke-dasharray')).toBe('6 4');
	});
});
