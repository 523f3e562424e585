import { type Page } from '@playwright/test';
// pdf-parse (registry, on Mozilla's pdf.js): an independent reader for what the report says
import { PDFParse } from 'pdf-parse';
import { expect, test } from './fixtures.ts';
import { pickAsset, syncAll, typeMode, waitReadyOffline } from './floor.ts';
import { signIn } from './helpers.ts';

async function chooseFrequencyUnit(page: Page, label: RegExp) {
	await page.goto('/settings');
	await page.getByLabel(label).check();
	await page.getByRole('button', { name: 'Save frequency unit' }).click();
	await expect(page.getByRole('status')).toContainText('Saved: frequencies in');
}

// 1 Hz = 60 CPM by definition. KRW-HLP-201 is a pump at a fixed 1185 rpm: its 1× line is 1185 CPM
// (a shaft at N rpm turns N times a minute), and a 1,020 CPM mode is 17 Hz.
test('an analyst who reads CPM types, sees, syncs and reports frequencies in CPM; Detune keeps Hz and a Hz reader sees Hz', async ({
	page,
	browser,
	context
}) => {
	// a supervisor, who does floor checks and reads the board
	await signIn(page, 'supervisor');
	await chooseFrequencyUnit(page, /CPM/);
	await page.goto('/field');
	await waitReadyOffline(page);
	await pickAsset(page, 'KRW-HLP-201');
	await page.getByLabel(/^Measured running speed/).fill('1185');
	await expect(page.getByText('Natural frequency (CPM)')).toBeVisible();
	await typeMode(page, 'quick', '');
	await expect(page.getByRole('alert').filter({ hasText: 'cycles per minute' })).toContainText(
		'Natural frequency: enter a number of cycles per minute greater than zero.'
	);
	await typeMode(page, '1020', '0.03');
	await expect(page.getByTestId('modes-list')).toContainText('1020 CPM');
	// margins, the worst pair and the diagram's axis in CPM: 1× at speed is 1185 CPM
	const pairs = page.getByTestId('worst-pairs');
	await expect(pairs).toContainText('1020 CPM × ');
	await expect(pairs).toContainText('(1185 CPM at speed)');
	await expect(pairs).not.toContainText(' Hz');
	await expect(page.getByTestId('bar-worst-pair')).toContainText('worst: 1020 CPM × ');
	await expect(page.getByTestId('interference-diagram')).toContainText('frequency (CPM)');
	await expect(page.getByTestId('interference-diagram')).toContainText('1020 CPM');
	await page.getByRole('button', { name: 'Save check' }).click();
	await expect(page.getByTestId('saved-message')).toContainText('KRW-HLP-201');
	await syncAll(page);

	// off the network the tablet still knows the choice: a new check on another asset reads CPM
	await context.setOffline(true);
	await page.reload();
	await pickAsset(page, 'KRW-HLP-202');
	await expect(page.getByText('Natural frequency (CPM)')).toBeVisible();
	await typeMode(page, '2400', '');
	await expect(page.getByTestId('modes-list')).toContainText('2400 CPM');
	await context.setOffline(false);

	// the board, its CSV, the asset sheet and the report, for the same user
	await page.goto('/board?q=KRW-HLP-201');
	const row = page.getByTestId('board-row').filter({ hasText: 'KRW-HLP-201' });
	await expect(row.getByTestId('board-worst')).toContainText('1020 CPM × ');
	const csv = await (await page.request.get('/api/board?format=csv&q=KRW-HLP-201')).text();
	const [head, line] = csv.trim().split(/\r?\n/);
	const cells = Object.fromEntries(head.split(',').map((h, i) => [h, line.split(',')[i]] as const));
	expect(cells.worst_natural_frequency_cpm).toBe('1020');
	expect(cells.worst_pair).toMatch(/^1020 CPM × /);
	await row.getByRole('link', { name: 'KRW-HLP-201' }).click();
	await expect(page.getByTestId('history-modes').first()).toHaveText('1020 CPM');
	const reportHref = await page
		.getByTestId('history')
		.getByRole('link', { name: 'PDF' })
		.first()
		.getAttribute('href');
	const pdf = await (await page.request.get(reportHref!)).body();
	const parser = new PDFParse({ data: new Uint8Array(pdf) });
	const text = (await parser.getText()).text.replace(/\s+/g, ' ');
	await parser.destroy();
	expect(text).toContain('Frequencies in CPM');
	expect(text).toContain('1020 CPM');
	expect(text).not.toContain('17.00 Hz');

	// stored once, in Hz: an admin who reads Hz sees the same mode as 17.00 Hz
	const desk = await browser.newPage();
	await signIn(desk, 'admin');
	await desk.goto('/board?q=KRW-HLP-201');
	await expect(
		desk.getByTestId('board-row').filter({ hasText: 'KRW-HLP-201' }).getByTestId('board-worst')
	).toContainText('17.00 Hz × ');
	await desk.close();
});
