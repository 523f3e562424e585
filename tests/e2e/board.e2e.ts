import { expect, test } from './fixtures.ts';
import { ORIGIN, signIn, signInApi } from './helpers.ts';

test('a supervisor filters the board, sorts, opens an asset, edits a vane count and sees the margins recomputed and the audit entry', async ({
	page
}) => {
	await signIn(page, 'supervisor');
	await page.goto('/board');
	await expect(page.getByTestId('board-row').first()).toBeVisible();
	await page
		.getByLabel('Site', { exact: true })
		.selectOption({ label: 'Kettle River Water Works' });
	await page.getByLabel('Verdict', { exact: true }).selectOption('conflict');
	await expect(page).toHaveURL(/verdict=conflict/);
	const rows = page.getByTestId('board-row');
	await expect(rows.first()).toBeVisible();
	const tags = await rows.evaluateAll((rs) => rs.map((r) => r.getAttribute('data-tag')!));
	expect(tags.length).toBeGreaterThan(0);
	expect(tags.every((t) => t.startsWith('KRW-'))).toBe(true);
	await expect(page.getByTestId('board').locator('[data-verdict]').first()).toHaveAttribute(
		'data-verdict',
		'conflict'
	);
	// sort by tag, then the back button returns to the previous order
	await page.getByRole('button', { name: /^Asset/ }).click();
	await expect(page).toHaveURL(/sort=tag/);
	await expect
		.poll(async () =>
			(await rows.evaluateAll((rs) => rs.map((r) => r.getAttribute('data-tag')!))).join()
		)
		.toBe([...tags].sort().join());
	await page.goBack();
	await expect(page).not.toHaveURL(/sort=tag/);
	await page.goForward();

	// open a pump from the board (one with a vane-pass source)
	await page.getByLabel('Verdict', { exact: true }).selectOption('');
	await page.getByLabel('Search tag or name').fill('KRW-HLP-202');
	await page.getByLabel('Search tag or name').press('Enter');
	await page.getByRole('link', { name: 'KRW-HLP-202' }).click();
	await expect(page.getByTestId('sheet-title')).toContainText('KRW-HLP-202');
	const showAll = async () => {
		const b = page.getByRole('button', { name: /^Show all/ });
		if (await b.count()) await b.click();
	};
	await showAll();
	const vaneRowsBefore = await page
		.getByTestId('pairs-table')
		.getByRole('row', { name: /Vane pass 1×/ })
		.first()
		.innerText();
	const vane = page
		.getByTestId('source')
		.filter({ has: page.locator('[name="p.count"]') })
		.first();
	await vane.getByLabel(/^Vanes/).fill('7');
	await vane.getByRole('button', { name: 'Save' }).click();
	await expect(vane.getByText('Saved; margins recomputed.')).toBeVisible();
	await showAll();
	const vaneRowsAfter = await page
		.getByTestId('pairs-table')
		.getByRole('row', { name: /Vane pass 1×/ })
		.first()
		.innerText();
	expect(vaneRowsAfter).not.toBe(vaneRowsBefore);
	// in words: the asset, the form's label, before → after (it showed "count":6 → "count":7)
	const change = page.getByTestId('audit').getByTestId('audit-line').first();
	await expect(change).toContainText('(an excitation source) · update vane on asset');
	await expect(change).toContainText('Values: 6 vanes → 7 vanes');
	await expect(page.getByTestId('audit')).not.toContainText('{');
});

test('an admin imports a CSV with a bad row (every problem named with its row, column and value, nothing imported), fixes it and imports', async ({
	page
}) => {
	await signIn(page, 'admin');
	await page.goto('/admin/import');
	const header =
		'tag,name,site_code,area,machine_kind,drive_type,min_rpm,max_rpm,vane_count,line_hz';
	const good = 'KRW-IMP-701,Imported pump A,KRW,High-Lift Station,pump,vfd,800,1180,6,60';
	// two problems in one row, and both are named in one pass
	const bad = 'KRW-IMP-702,Imported pump B,KRW,High-Lift Station,pump,vfd,1180,800,-6,60';
	await page.getByLabel(/CSV file/).setInputFiles({
		name: 'assets.csv',
		mimeType: 'text/csv',
		buffer: Buffer.from([header, good, bad].join('\n'))
	});
	await page.getByRole('button', { name: 'Check the file' }).click();
	await expect(page.getByTestId('import-errors')).toContainText(
		'Row 3, column max_rpm (“800”): Maximum speed must be at least the minimum speed.'
	);
	await expect(page.getByTestId('import-errors')).toContainText('Row 3, column vane_count (“-6”)');
	await expect(page.getByTestId('import-errors')).toContainText('nothing has been imported');
	const before = await (await page.request.get('/api/board?q=KRW-IMP')).json();
	expect(before.total).toBe(0);
	const fixed = bad.replace('1180,800,-6', '800,1180,6');
	await page.getByLabel(/CSV file/).setInputFiles({
		name: 'assets.csv',
		mimeType: 'text/csv',
		buffer: Buffer.from([header, good, fixed].join('\n'))
	});
	await page.getByRole('button', { name: 'Check the file' }).click();
	await expect(page.getByTestId('import-ready')).toHaveText('2 rows ready to import.');
	await page.getByRole('button', { name: 'Import 2 rows' }).click();
	await expect(page.getByTestId('import-done')).toHaveText('Imported: 2 added, 0 updated.');
	const after = await (await page.request.get('/api/board?q=KRW-IMP')).json();
	expect(after.total).toBe(2);
});

test('a technician reaches neither the edit forms nor the import, and the server refuses them too', async ({
	page,
	browser
}) => {
	await signIn(page, 'technician');
	const api = await browser.newContext({ baseURL: ORIGIN });
	await signInApi(api.request, 'technician');
	const pulled = await (await api.request.get('/api/sync/pull?since=0')).json();
	const asset = pulled.assets.find((a: { tag: string }) => a.tag === 'KRW-HLP-202');
	await page.goto(`/assets/${asset.id}`);
	await expect(page.getByTestId('sheet-title')).toContainText('KRW-HLP-202');
	await expect(page.getByTestId('asset-form')).toHaveCount(0);
	await expect(page.getByRole('button', { name: 'Save' })).toHaveCount(0);
	const source = asset.sources.find((s: { kind: string }) => s.kind === 'vane');
	const post = (path: string, form: Record<string, string>) =>
		api.request.post(path, {
			form,
			headers: { origin: ORIGIN, accept: 'application/json', 'x-sveltekit-action': 'true' },
			maxRedirects: 0
		});
	expect(
		(
			await post(`/assets/${asset.id}?/updateSource`, { sourceId: source.id, 'p.count': '9' })
		).status()
	).toBe(403);
	expect((await post(`/assets/${asset.id}?/updateAsset`, { name: 'Hijacked' })).status()).toBe(403);
	expect(
		(
			await post('/admin/import?/import', {
				text: 'tag,name,site_code,min_rpm,max_rpm\nX-1,x,KRW,1,1'
			})
		).status()
	).toBe(403);
	expect((await api.request.get('/api/board')).status()).toBe(403);
	expect((await api.request.get('/admin/import', { maxRedirects: 0 })).status()).toBe(403);
	const again = await (await api.request.get('/api/sync/pull?since=0')).json();
	expect(
		again.assets
			.find((a: { tag: string }) => a.tag === 'KRW-HLP-202')
			.sources.find((s: { kind: string }) => s.kind === 'vane').params.count
	).toBe(source.params.count);
	await api.close();
});

test('a supervisor gives a drive motor its slip: an odd pole count is refused, the slip is kept and reaches the tablet', async ({
	page
}) => {
	await signIn(page, 'supervisor');
	await page.goto('/board?q=LBM-IDF-110');
	await page.getByRole('link', { name: 'LBM-IDF-110' }).click();
	await expect(page.getByTestId('sheet-title')).toContainText('LBM-IDF-110');
	const form = page.getByTestId('asset-form');
	await form.getByLabel('Motor poles').fill('5');
	await form.getByRole('button', { name: /^Save/ }).click();
	await expect(form.getByText('Motor poles: an even number (poles come in pairs).')).toBeVisible();
	await form.getByLabel('Motor poles').fill('6');
	await form.getByLabel(/^Motor slip/).fill('1.7');
	await form.getByRole('button', { name: /^Save/ }).click();
	await expect(page.getByText('Asset saved; margins recomputed.')).toBeVisible();
	await page.reload();
	await expect(page.getByTestId('asset-form').getByLabel(/^Motor slip/)).toHaveValue('1.7');
	// what the tablet receives for the same asset carries the slip too
	const pulled = await (await page.request.get('/api/sync/pull?since=0')).json();
	expect(pulled.assets.find((a: { tag: string }) => a.tag === 'LBM-IDF-110').slipPct).toBe(1.7);
});
