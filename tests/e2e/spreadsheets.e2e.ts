import { readFileSync } from 'node:fs';
import ExcelJS from 'exceljs';
import * as XLSX from '@e965/xlsx';
import { expect, test } from './fixtures.ts';
import { signIn } from './helpers.ts';
import { FOLLOW_UP_COLUMNS } from '../../src/lib/schemas/follow-up.ts';

test('an admin imports assets from an Excel workbook with the CSV checks, and a planner exports follow-ups to Excel', async ({
	page,
	browser
}) => {
	await signIn(page, 'admin');
	await page.goto('/admin/import');
	// a planner's sheet: numbers as numbers, one bad row first
	const wb = new ExcelJS.Workbook();
	const ws = wb.addWorksheet('Pumps');
	ws.addRow([
		'tag',
		'name',
		'site_code',
		'area',
		'machine_kind',
		'drive_type',
		'min_rpm',
		'max_rpm',
		'vane_count',
		'machine_group'
	]);
	ws.addRow([
		'KRW-XLS-801',
		'Workbook pump A',
		'KRW',
		'High-Lift Station',
		'pump',
		'vfd',
		800,
		1180,
		6,
		'group3'
	]);
	ws.addRow([
		'KRW-XLS-802',
		'Workbook pump B',
		'KRW',
		'High-Lift Station',
		'pump',
		'vfd',
		1180,
		800,
		6,
		'group1'
	]);
	const file = async () => ({
		name: 'pumps.xlsx',
		mimeType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
		buffer: Buffer.from(await wb.xlsx.writeBuffer())
	});
	await page.getByLabel(/CSV file/).setInputFiles(await file());
	await page.getByRole('button', { name: 'Check the file' }).click();
	const errors = page.getByTestId('import-errors');
	await expect(errors).toContainText(
		'Row 3, column max_rpm (“800”): Maximum speed must be at least the minimum speed.'
	);
	await expect(errors).toContainText('Row 2, column machine_group (“group3”)');
	ws.getRow(3).getCell(7).value = 800;
	ws.getRow(3).getCell(8).value = 1180;
	ws.getRow(2).getCell(10).value = 'group2';
	await page.getByLabel(/CSV file/).setInputFiles(await file());
	await page.getByRole('button', { name: 'Check the file' }).click();
	await expect(page.getByTestId('import-ready')).toHaveText('2 rows ready to import.');
	await page.getByRole('button', { name: 'Import 2 rows' }).click();
	await expect(page.getByTestId('import-done')).toHaveText('Imported: 2 added, 0 updated.');
	const board = await (await page.request.get('/api/board?q=KRW-XLS')).json();
	expect(board.total).toBe(2);

	// the planner's export opens in any spreadsheet: read back here by SheetJS, a second library
	const planner = await browser.newPage();
	await signIn(planner, 'planner');
	await planner.goto('/follow-ups');
	const [download] = await Promise.all([
		planner.waitForEvent('download'),
		planner.getByRole('link', { name: 'Export Excel' }).click()
	]);
	expect(download.suggestedFilename()).toBe('detune-follow-ups.xlsx');
	const path = await download.path();
	const book = XLSX.read(readFileSync(path!), { type: 'buffer' });
	const rows = XLSX.utils.sheet_to_json<string[]>(book.Sheets['Follow-ups'], { header: 1 });
	expect(rows[0]).toEqual(FOLLOW_UP_COLUMNS);
	const csv = await (await planner.request.get('/follow-ups/export.csv')).text();
	expect(rows.length).toBe(csv.trim().split('\r\n').length);
	await planner.close();
});
