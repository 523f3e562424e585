import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { toCsv } from './csv.ts';

describe('CSV export', () => {
	it('defuses every cell a spreadsheet would run, tab and carriage return included', () => {
		const text = toCsv(
			['a'],
			[['=1+1'], ['+SUM(A1)'], ['-2+3'], ['@cmd'], ['\t=1+1'], ['\r=1+1'], ['-12.5'], [-3], ['ok']]
		);
		const back = Papa.parse<string[]>(text.trim(), { newline: '\r\n' })
			.data.slice(1)
			.map((r) => r[0]);
		expect(back).toEqual([
			"'=1+1",
			"'+SUM(A1)",
			"'-2+3",
			"'@cmd",
			"'\t=1+1",
			"'\r=1+1",
			'-12.5',
			'-3',
			'ok'
		]);
	});

	it('quotes commas, quotes and line breaks, and ends lines with CRLF', () => {
		const text = toCsv(
			['x', 'y'],
			[
				['a,b', 'say "hi"'],
				['two\nlines', null]
			]
		);
		expect(text).toBe('x,y\r\n"a,b","say ""hi"""\r\n"two\nlines",\r\n');
	});
});
