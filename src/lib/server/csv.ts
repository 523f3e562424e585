/**
 * CSV files Detune writes, through Papa.unparse (RFC 4180 quoting, CRLF). A text that a
 * spreadsheet would run as a formula — starting with =, +, -, @, a tab or a carriage return — is
 * prefixed with ' ; a plain negative number stays a number.
 */
import Papa from 'papaparse';

const FORMULA = /^([=+@\t\r]|-(?!\d+(\.\d+)?$))/;

export function toCsv(fields: string[], rows: unknown[][]): string {
	return (
		Papa.unparse(
			{ fields, data: rows.map((r) => r.map((v) => (v === null || v === undefined ? '' : v))) },
			{ escapeFormulae: FORMULA, newline: '\r\n' }
		) + '\r\n'
	);
}
