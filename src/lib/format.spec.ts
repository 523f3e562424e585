import { describe, expect, it } from 'vitest';
import { day, dayTimeLocal, dayTimeUtc, formatHz, isoDay } from './format.ts';

describe('one way of writing dates and times', () => {
	const t = Date.UTC(2026, 11, 2, 14, 5);
	it('names the zone, never writes 12/2/2026, and reads a stored day as itself', () => {
		expect(dayTimeUtc(t)).toBe('2 Dec 2026, 14:05 UTC');
		expect(dayTimeLocal(t)).toMatch(/^\d{1,2} [A-Z][a-z]{2} 2026, \d{2}:\d{2} \S+/);
		expect(day(t)).toMatch(/^\d{1,2} (Dec|Nov) 2026$/);
		// a due date is a calendar day, the same everywhere
		expect(isoDay('2026-12-09')).toBe('9 Dec 2026');
		expect(isoDay(null)).toBe('—');
		expect(dayTimeUtc(null)).toBe('—');
		expect(formatHz(2048)).toBe('2048 Hz');
	});
});
