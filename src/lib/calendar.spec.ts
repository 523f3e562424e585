import { describe, expect, it } from 'vitest';
import { addDays, mondayOf, weekDays } from './calendar.ts';
import { weekdayDay } from './format.ts';

// Weekdays of known dates from the Gregorian calendar (ISO 8601 weeks begin on Monday):
// 2026-12-02 is a Wednesday, 2027-01-01 a Friday, 2024-02-29 a Thursday.
describe('calendar weeks', () => {
	it('finds the Monday of a week, across a month, a year and a leap day', () => {
		expect(mondayOf('2026-12-02')).toBe('2026-11-30');
		expect(mondayOf('2026-11-30')).toBe('2026-11-30');
		expect(mondayOf('2026-12-06')).toBe('2026-11-30'); // Sunday belongs to the week before it
		expect(mondayOf('2027-01-01')).toBe('2026-12-28');
		expect(mondayOf('2024-03-01')).toBe('2024-02-26');
	});
	it('lists seven days Monday to Sunday, the leap day included', () => {
		expect(weekDays('2024-02-26')).toEqual([
			'2024-02-26',
			'2024-02-27',
			'2024-02-28',
			'2024-02-29',
			'2024-03-01',
			'2024-03-02',
			'2024-03-03'
		]);
		expect(addDays('2026-12-28', 7)).toBe('2027-01-04');
		expect(addDays('2026-03-30', -7)).toBe('2026-03-23'); // across a European clock change
	});
	it('writes a day with its weekday', () => {
		expect(weekdayDay('2026-12-02')).toBe('Wed 2 Dec');
		expect(weekdayDay('2027-01-01')).toBe('Fri 1 Jan');
	});
});
