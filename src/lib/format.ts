/**
 * How Detune shows times to people: one module, so every screen says the same thing the same way.
 * Dates are the device's local calendar day, written unambiguously (2 Dec 2026).
 */
const dayFormat = new Intl.DateTimeFormat('en-GB', {
	day: 'numeric',
	month: 'short',
	year: 'numeric'
});
const timeFormat = new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit' });

/** "2 Dec 2026" */
export const day = (t: number | null | undefined): string =>
	t === null || t === undefined ? '—' : dayFormat.format(t);

/** "2 Dec 2026, 14:05" */
export const dayTime = (t: number | null | undefined): string =>
	t === null || t === undefined ? '—' : `${dayFormat.format(t)}, ${timeFormat.format(t)}`;

/** "just now", "5 min ago", "3 h ago", "2 d ago", or "never" */
export function ago(t: number | null | undefined, now = Date.now()): string {
	if (t === null || t === undefined) return 'never';
	const s = Math.max(0, Math.round((now - t) / 1000));
	if (s < 60) return 'just now';
	if (s < 3600) return `${Math.round(s / 60)} min ago`;
	if (s < 86400) return `${Math.round(s / 3600)} h ago`;
	return `${Math.round(s / 86400)} d ago`;
}

/** A sample rate as a person writes it: 4096 Hz for 4095.99971…, 2.5 kHz stays 2500 Hz. */
export function formatHz(hz: number): string {
	const near = Math.round(hz);
	if (Math.abs(hz - near) <= 1e-4 * hz) return `${near} Hz`;
	return `${Number(hz.toPrecision(6))} Hz`;
}

const utcDay = new Intl.DateTimeFormat('en-GB', {
	day: 'numeric',
	month: 'short',
	year: 'numeric',
	timeZone: 'UTC'
});
const utcTime = new Intl.DateTimeFormat('en-GB', {
	hour: '2-digit',
	minute: '2-digit',
	timeZone: 'UTC'
});

/** "2 Dec 2026, 14:05 UTC": for what the server writes (exports, reports), the zone named. */
export const dayTimeUtc = (t: number | null | undefined): string =>
	t === null || t === undefined ? '—' : `${utcDay.format(t)}, ${utcTime.format(t)} UTC`;

const localDayTime = new Intl.DateTimeFormat('en-GB', {
	day: 'numeric',
	month: 'short',
	year: 'numeric',
	hour: '2-digit',
	minute: '2-digit',
	timeZoneName: 'short'
});

/** "2 Dec 2026, 15:49 CET": this device's local time, its zone named. */
export const dayTimeLocal = (t: number | null | undefined): string =>
	t === null || t === undefined ? '—' : localDayTime.format(t);

/** A calendar date as stored (YYYY-MM-DD) written as a person reads it: "9 Dec 2026". */
export const isoDay = (d: string | null | undefined): string =>
	d ? utcDay.format(Date.parse(`${d}T00:00:00Z`)) : '—';

const weekdayFormat = new Intl.DateTimeFormat('en-GB', {
	weekday: 'short',
	day: 'numeric',
	month: 'short',
	timeZone: 'UTC'
});

/** A calendar date as stored (YYYY-MM-DD) with its weekday: "Tue 8 Dec". */
export const weekdayDay = (d: string): string => weekdayFormat.format(Date.parse(`${d}T00:00:00Z`));
