import { beforeAll, describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import * as XLSX from '@e965/xlsx';
import Papa from 'papaparse';
import { freshDatabase } from './test-db.ts';
import { TEMPLATE, validate } from './db/import.ts';
import { isZip, sheetToCsv, tableToXlsx, WorkbookError } from './xlsx.ts';
import { toCsv } from './csv.ts';

beforeAll(async () => {
	await freshDatabase({ demo: true });
});

// The CSV template's rows as a spreadsheet holds them: numbers as numbers, text as text
const templateRows = () => {
	const rows = Papa.parse<string[]>(TEMPLATE, { skipEmptyLines: true }).data;
	return rows.map((r, i) =>
		i === 0 ? r : r.map((c) => (c !== '' && /^-?\d+(\.\d+)?$/.test(c) ? Number(c) : c))
	);
};
const same = (v: ReturnType<typeof validate>) =>
	v.rows.map((r) => ({ tag: r.tag, siteId: r.siteId, asset: r.asset, sources: r.sources }));

describe('asset import from a workbook', () => {
	it('reads a workbook written by exceljs to the same assets as the CSV template', async () => {
		const wb = new ExcelJS.Workbook();
		const ws = wb.addWorksheet('Assets');
		for (const r of templateRows()) ws.addRow(r);
		const bytes = new Uint8Array(await wb.xlsx.writeBuffer());
		expect(isZip(bytes)).toBe(true);
		const fromXlsx = validate(await sheetToCsv(bytes));
		const fromCsv = validate(TEMPLATE);
		expect(fromCsv.errors).toEqual([]);
		expect(fromXlsx.errors).toEqual([]);
		expect(same(fromXlsx)).toEqual(same(fromCsv));
		expect(fromXlsx.rows.map((r) => r.tag)).toEqual(['KRW-RWP-105', 'LBM-EXF-130']);
	});

	it('reads a workbook written by a second, independent writer (SheetJS) to the same assets', async () => {
		const sheet = XLSX.utils.aoa_to_sheet(templateRows());
		const book = XLSX.utils.book_new();
		XLSX.utils.book_append_sheet(book, sheet, 'Assets');
		const bytes = new Uint8Array(XLSX.write(book, { type: 'buffer', bookType: 'xlsx' }));
		const v = validate(await sheetToCsv(bytes));
		expect(v.errors).toEqual([]);
		expect(same(v)).toEqual(same(validate(TEMPLATE)));
	});

	it('gives the workbook the CSV path’s errors, every one with its row and column', async () => {
		const rows = templateRows();
		rows[1][rows[0].indexOf('min_rpm')] = 'fast';
		rows[2][rows[0].indexOf('site_code')] = 'XYZ';
		const sheet = XLSX.utils.aoa_to_sheet(rows);
		const book = XLSX.utils.book_new();
		XLSX.utils.book_append_sheet(book, sheet, 'Assets');
		const v = validate(
			await sheetToCsv(new Uint8Array(XLSX.write(book, { type: 'buffer', bookType: 'xlsx' })))
		);
		expect(v.errors).toEqual(
			expect.arrayContaining([
				expect.objectContaining({ row: 2, column: 'min_rpm', value: 'fast' }),
				expect.objectContaining({ row: 3, column: 'site_code' })
			])
		);
	});

	it('refuses a damaged workbook with one clear message', async () => {
		const broken = Uint8Array.from([0x50, 0x4b, 3, 4, 1, 2, 3, 4, 5, 6, 7, 8]);
		await expect(sheetToCsv(broken)).rejects.toThrow(WorkbookError);
		await expect(sheetToCsv(broken)).rejects.toThrow(/cannot be read.*save it again/);
	});
});

describe('tables exported as workbooks', () => {
	it('writes the same cells as the CSV, read back by an independent reader (SheetJS)', async () => {
		const head = ['tag', 'title', 'due_date', 'notes'];
		const rows = [
			['KRW-RWP-101', 'Brace the motor stand', '2027-03-01', '=HYPERLINK("x")'],
			['LBM-IDF-110', 'Program the skip band, 12–14 Hz', '', 'two\nlines']
		];
		const book = XLSX.read(await tableToXlsx('Follow-ups', head, rows), { type: 'buffer' });
		const back = XLSX.utils.sheet_to_json<string[]>(book.Sheets['Follow-ups'], {
			header: 1,
			defval: ''
		});
		expect(back).toEqual([head, ...rows]);
		// the formula-looking note stayed text, not a formula
		expect(book.Sheets['Follow-ups']['D2'].f).toBeUndefined();
		const csv = Papa.parse<string[]>(toCsv(head, rows), { skipEmptyLines: true }).data;
		expect(csv[1].slice(0, 3)).toEqual(back[1].slice(0, 3));
	});
});
