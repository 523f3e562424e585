import { describe, expect, it } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/svelte';
import ResultsTable from './ResultsTable.svelte';
import { evaluateCheck } from '$lib/vibration';
import { frequencyUnitContext } from '$lib/components/frequency-context';

// pairs from the engine itself: a fan at 600–1,800 rpm with 1× and 2× shaft and three modes
const check = (rule: Parameters<typeof evaluateCheck>[0]['rule'], zeta: number | null = null) =>
	evaluateCheck({
		speedRange: { minRpm: 600, maxRpm: 1800 },
		measuredRpm: 1200,
		sources: [{ id: 's', kind: 'shaft', orders: [1, 2] }],
		modes: [{ frequencyHz: 20, dampingRatio: zeta }, { frequencyHz: 45 }, { frequencyHz: 95 }],
		rule
	}).pairs;

describe('ResultsTable (Floor check)', () => {
	it('shows the three worst pairs, and the full table behind one button', async () => {
		render(ResultsTable, { pairs: check({ kind: 'fixed', percent: 10 }) });
		expect(screen.getByText('The three worst pairs')).toBeTruthy();
		expect(screen.getAllByTestId('worst-pair')).toHaveLength(3);
		expect(screen.queryByTestId('pairs-table')).toBeNull();
		const button = screen.getByRole('button', { name: 'Show all 6 pairs' });
		expect(button.getAttribute('aria-expanded')).toBe('false');
		await fireEvent.click(button);
		expect(screen.getByTestId('pairs-table').querySelectorAll('tbody tr')).toHaveLength(6);
		expect(screen.getByRole('button', { name: 'Hide the full table' })).toBeTruthy();
	});

	it('writes every frequency in CPM for a reader who chose CPM (1 Hz = 60 CPM)', () => {
		render(ResultsTable, {
			props: { pairs: check({ kind: 'fixed', percent: 10 }) },
			context: frequencyUnitContext('CPM')
		});
		const text = screen.getByTestId('worst-pairs').textContent ?? '';
		// the 20, 45 and 95 Hz modes: 1200, 2700 and 5700 CPM; 1× at 1200 rpm is 1200 CPM
		expect(text).toContain('1200 CPM × ');
		expect(text).toContain('(1200 CPM at speed)');
		expect(text).not.toMatch(/\d Hz/);
	});

	it('names a crossed pair the rule lets pass instead of showing a bare clear', () => {
		// 20 Hz with ζ 0.25 (AF 2) sits inside the 1× band of 10–30 Hz: no margin by API 684
		render(ResultsTable, { pairs: check({ kind: 'amplification' }, 0.25) });
		const remarks = screen.getAllByTestId('pair-remark');
		expect(remarks.length).toBeGreaterThan(0);
		expect(remarks[0].textContent).toMatch(/sweeps across this mode; the rule asks no margin/);
		expect(screen.getAllByText(/^crossed · needs 0.0 %/).length).toBeGreaterThan(0);
	});
});
