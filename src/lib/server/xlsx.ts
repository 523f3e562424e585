/**
 * Spreadsheets in and out, through exceljs: an asset list saved as .xlsx is read into the same
 * CSV text the import already validates (one path, one set of rules), and tables Detune exports
 * are written as workbooks with a header row, typed cells and no formulas.
 */
import ExcelJS from 'exceljs';
import { toCsv } from './csv.ts';

/** A workbook's first bytes: an .xlsx is a zip (PK\x03\x04). */
export const isZip = (bytes: Uint8Array) =>
	bytes.length > 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 3 && bytes[3] === 4;

export class WorkbookError extends Error {}

/** One cell as the text a person typed: numbers plainly, dates as ISO days, formulas by their result. */
function cellText(v: ExcelJS.CellValue): string {
	if (v === null || v === undefined) return '';
	if (v instanceof Date) return v.toISOString().slice(0, 10);
	if (typeof v === 'number') return String(v);
	if (typeof v === 'boolean') return v ? 'true' : 'false';
	if (typeof v === 'string') return v;
	if ('richText' in v) return v.richText.map((t) => t.text).join('');
	if ('text' in v && typeof v.text === 'string') return v.text;
	if ('result' in v) return cellText((v.result ?? null) as ExcelJS.CellValue);
	if ('error' in v) return '';
	return String(v);
}

/** The first worksheet as CSV text (its first row the header), for the CSV import's rules. */
export async function sheetToCsv(bytes: Uint8Array): Promise<string> {
	const wb = new ExcelJS.Workbook();
	try {
		await wb.xlsx.load(bytes as unknown as ArrayBuffer);
	} catch (e) {
		throw new WorkbookError(
			`This workbook cannot be read (${(e as Error).message}); save it again as .xlsx, or as “CSV UTF-8”.`
		);
	}
	const ws = wb.worksheets[0];
	if (!ws || ws.rowCount === 0) throw new WorkbookError('The workbook’s first sheet is empty.');
	const width = ws.getRow(1).cellCount;
	const rows: string[][] = [];
	ws.eachRow({ includeEmpty: false }, (row) => {
		const cells: string[] = [];
		for (let c = 1; c <= width; c++) cells.push(cellText(row.getCell(c).value).trim());
		if (cells.some((x) => x !== '')) rows.push(cells);
	});
	const [head, ...data] = rows;
	return toCsv(head, data);
}

/** A table as a workbook: one sheet, a bold frozen header, columns sized to their content. */
export async function tableToXlsx(
	sheetName: string,
	head: string[],
	rows: (string | number | Date | null)[][]
): Promise<Buffer> {
	const wb = new ExcelJS.Workbook();
	wb.creator = 'Detune';
	const ws = wb.addWorksheet(sheetName, { views: [{ state: 'frozen', ySplit: 1 }] });
	ws.addRow(head).font = { bold: true };
	// text that a spreadsheet would take for a formula stays text: exceljs writes strings as strings
	for (const r of rows) ws.addRow(r.map((v) => (v === null ? '' : v)));
	ws.columns.forEach((col, i) => {
		const longest = Math.max(head[i].length, ...rows.map((r) => String(r[i] ?? '').length));
		col.width = Math.min(60, Math.max(8, longest + 2));
	});
	return Buffer.from(await wb.xlsx.writeBuffer());
}
