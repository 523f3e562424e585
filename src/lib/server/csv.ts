/**
 * One CSV cell (RFC 4180 quoting). A text starting with =, +, - or @ is prefixed with ' so a
 * spreadsheet never runs it as a formula; a plain number stays a number.
 */
export function csvCell(v: unknown): string {
	const s = String(v ?? '');
	const safe = /^[=+\-@]/.test(s) && !/^-?\d+(\.\d+)?$/.test(s) ? `'${s}` : s;
	return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}
