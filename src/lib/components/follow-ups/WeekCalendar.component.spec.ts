import { describe, expect, it, vi } from 'vitest';
import { createEvent, fireEvent, render, screen, within } from '@testing-library/svelte';
import WeekCalendar from './WeekCalendar.svelte';
import type { CalendarItem } from '$lib/calendar';

const item = (id: string, dueDate: string | null, status = 'scheduled'): CalendarItem => ({
	id,
	assetId: `a-${id}`,
	tag: `TAG-${id}`,
	title: `Work ${id}`,
	status,
	priority: 'high',
	dueDate,
	assigneeName: 'Tomas Ferreira'
});

// the week of Monday 30 Nov 2026; today is Wednesday 2 Dec
const week = { monday: '2026-11-30', today: '2026-12-02' };
const dayCell = (iso: string) =>
	screen.getAllByTestId('calendar-day').find((d) => d.dataset.day === iso)!;

describe('WeekCalendar (follow-ups)', () => {
	it('puts each follow-up under its day, and what has no date or was due last week in the tray', () => {
		render(WeekCalendar, {
			items: [item('1', '2026-12-03'), item('2', null, 'open'), item('3', '2026-11-20')],
			...week,
			canMove: true,
			onmove: () => {}
		});
		const days = screen.getAllByTestId('calendar-day').map((d) => d.dataset.day);
		expect(days).toEqual([
			'2026-11-30',
			'2026-12-01',
			'2026-12-02',
			'2026-12-03',
			'2026-12-04',
			'2026-12-05',
			'2026-12-06'
		]);
		expect(within(dayCell('2026-12-03')).getByText('Work 1')).toBeTruthy();
		expect(within(dayCell('2026-12-02')).getByText('today')).toBeTruthy();
		const tray = screen.getByTestId('calendar-waiting');
		expect(within(tray).getByText('Work 2')).toBeTruthy();
		expect(within(tray).getByText('was due Fri 20 Nov')).toBeTruthy();
	});

	it('moves by Move then Move here, offering only today and later days', async () => {
		const onmove = vi.fn();
		render(WeekCalendar, { items: [item('1', '2026-12-03')], ...week, canMove: true, onmove });
		await fireEvent.click(screen.getByRole('button', { name: 'Move' }));
		const targets = screen.getAllByRole('button', { name: /^Move TAG-1 to / });
		// Wed, Fri, Sat, Sun: not Mon or Tue (past), not Thu (already there)
		expect(targets.map((b) => b.getAttribute('aria-label'))).toEqual([
			'Move TAG-1 to Wed 2 Dec',
			'Move TAG-1 to Fri 4 Dec',
			'Move TAG-1 to Sat 5 Dec',
			'Move TAG-1 to Sun 6 Dec'
		]);
		await fireEvent.click(targets[1]);
		expect(onmove).toHaveBeenCalledWith('1', '2026-12-04');
		expect(screen.queryAllByRole('button', { name: /^Move TAG-1 to / })).toHaveLength(0);
	});

	it('moves by a drop on a day, and ignores a drop on a past day', async () => {
		const onmove = vi.fn();
		render(WeekCalendar, { items: [item('1', null, 'open')], ...week, canMove: true, onmove });
		const card = screen.getAllByTestId('calendar-item')[0];
		expect(card.getAttribute('draggable')).toBe('true');
		await fireEvent.dragStart(card);
		const past = dayCell('2026-12-01');
		const over = createEvent.dragOver(past);
		await fireEvent(past, over);
		expect(over.defaultPrevented).toBe(false); // the past day does not accept it
		await fireEvent.drop(past);
		expect(onmove).not.toHaveBeenCalled();
		await fireEvent.dragStart(card);
		const saturday = dayCell('2026-12-05');
		const ok = createEvent.dragOver(saturday);
		await fireEvent(saturday, ok);
		expect(ok.defaultPrevented).toBe(true);
		await fireEvent.drop(saturday);
		expect(onmove).toHaveBeenCalledWith('1', '2026-12-05');
	});

	it('lets only planners move, and never a closed follow-up', () => {
		render(WeekCalendar, {
			items: [item('1', '2026-12-03'), item('2', '2026-12-04', 'retested')],
			...week,
			canMove: false,
			onmove: () => {}
		});
		expect(screen.queryAllByRole('button', { name: 'Move' })).toHaveLength(0);
		for (const c of screen.getAllByTestId('calendar-item'))
			expect(c.getAttribute('draggable')).toBe('false');
	});
});
