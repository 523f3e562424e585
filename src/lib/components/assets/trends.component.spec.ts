import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/svelte';
import LevelTrend from './LevelTrend.svelte';
import TrendChart from './TrendChart.svelte';
import { trendFrame } from './trend-frame';

const DAY = 86_400_000;

describe('the asset sheet’s trends', () => {
	it('share one frame: time from the first check to the last, values from 0 up', () => {
		const f = trendFrame([3 * DAY, DAY, 2 * DAY], 10, 640, 200, { l: 48, r: 12, t: 12, b: 36 });
		expect([f.t0, f.t1]).toEqual([DAY, 3 * DAY]);
		expect(f.sx(DAY)).toBe(48);
		expect(f.sx(3 * DAY)).toBe(640 - 12);
		expect(f.sy(0)).toBe(200 - 36);
		expect(f.sy(10)).toBe(12);
		expect(
			f.path([
				{ at: DAY, v: 0 },
				{ at: 3 * DAY, v: 10 }
			])
		).toBe('M48.0,164.0 L628.0,12.0');
		// one check still spans a day, so nothing divides by zero
		const one = trendFrame([DAY], 1, 640, 200, { l: 0, r: 0, t: 0, b: 0 });
		expect(one.t1 - one.t0).toBe(DAY);
		expect(Number.isFinite(one.sx(DAY))).toBe(true);
	});

	it('draws the level against the zone boundaries, and the margins as two lines', () => {
		const { container } = render(LevelTrend, {
			points: [
				{ at: DAY, v: 2, zone: 'B' },
				{ at: 5 * DAY, v: 5, zone: 'D' }
			],
			limits: { abMmS: 1.4, bcMmS: 2.8, cdMmS: 4.5 }
		});
		expect(screen.getByRole('img').getAttribute('aria-label')).toContain('latest 5 mm/s, zone D');
		expect(container.querySelectorAll('circle')).toHaveLength(2);
		// three dashed boundaries, named at the right
		expect(container.querySelectorAll('line[stroke-dasharray]')).toHaveLength(3);
		for (const n of ['A/B', 'B/C', 'C/D']) expect(container.textContent).toContain(n);
		const chart = render(TrendChart, {
			points: [
				{ at: DAY, atSpeed: 12, overRange: 4 },
				{ at: 3 * DAY, atSpeed: null, overRange: 8 }
			]
		}).container;
		// over the range at both checks; at speed only where it was measured
		expect(chart.querySelectorAll('path')[0].getAttribute('d')).toMatch(/^M\S+ L\S+$/);
		expect(chart.querySelectorAll('path')[1].getAttribute('d')).toMatch(/^M\S+$/);
		expect(chart.querySelectorAll('circle')).toHaveLength(3);
		expect(chart.textContent).toContain('0 %');
	});
});
