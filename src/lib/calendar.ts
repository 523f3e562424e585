/**
 * Calendar days as stored (YYYY-MM-DD), counted in UTC so no time zone or daylight-saving change
 * moves a day: the week a follow-up falls in, and the days around it.
 */
const DAY_MS = 86_400_000;

const toMs = (iso: string) => Date.parse(`${iso}T00:00:00Z`);
const fromMs = (t: number) => new Date(t).toISOString().slice(0, 10);

/** The day `n` days after `iso` (before, for negative n). */
export const addDays = (iso: string, n: number): string => fromMs(toMs(iso) + n * DAY_MS);

/** The Monday of the week `iso` falls in (ISO 8601 weeks start on Monday). */
export function mondayOf(iso: string): string {
	const t = toMs(iso);
	return fromMs(t - ((new Date(t).getUTCDay() + 6) % 7) * DAY_MS);
}

/** The seven days, Monday to Sunday, of the week starting `monday`. */
export const weekDays = (monday: string): string[] =>
	Array.from({ length: 7 }, (_, i) => addDays(monday, i));

/** A follow-up as the week calendar shows it. */
export interface CalendarItem {
	id: string;
	assetId: string;
	tag: string;
	title: string;
	status: string;
	priority: string;
	dueDate: string | null;
	assigneeName: string | null;
}
