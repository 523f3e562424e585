import { expect, test } from './fixtures.ts';
import { signIn } from './helpers.ts';

test('an admin reads the audit log in words, filters it by asset, user and date, and exports it as CSV', async ({
	page
}) => {
	await signIn(page, 'admin');
	const pulled = await (await page.request.get('/api/sync/pull?since=0')).json();
	const asset = pulled.assets.find((a: { tag: string }) => a.tag === 'LBM-CTF-211');
	// a change to record: the asset's notes, through its sheet's form
	await page.goto(`/assets/${asset.id}`);
	await page.getByLabel('Notes').first().fill('Fan deck grating replaced 2026');
	await page.getByRole('button', { name: 'Save asset data' }).click();
	await expect(page.getByTestId('audit')).toContainText('Fan deck grating replaced 2026');

	await page.goto('/admin/audit');
	await page.getByLabel('Asset').selectOption({ label: `LBM-CTF-211 · ${asset.name}` });
	await page.getByLabel('Who').selectOption({ label: 'Morgan Reyes' });
	const today = new Date().toISOString().slice(0, 10);
	await page.getByLabel(/From/).fill(today);
	await page.getByLabel(/To/).fill(today);
	await page.getByRole('button', { name: 'Show' }).click();
	const line = page.getByTestId('audit-line').first();
	await expect(line).toContainText(`LBM-CTF-211 · ${asset.name} · changed`);
	await expect(line).toContainText('Notes:');
	await expect(line).toContainText('→ Fan deck grating replaced 2026');
	await expect(line).toContainText('Morgan Reyes');
	await expect(page.getByTestId('audit-log')).not.toContainText(asset.id);
	// another user's filter shows none of it
	await page.getByLabel('Who').selectOption({ label: 'Ines Halvorsen' });
	await page.getByRole('button', { name: 'Show' }).click();
	await expect(page.getByTestId('audit-empty')).toBeVisible();
	// the export carries the same filters
	await page.getByLabel('Who').selectOption({ label: 'Morgan Reyes' });
	await page.getByRole('button', { name: 'Show' }).click();
	const download = page.waitForEvent('download');
	await page.getByRole('link', { name: 'CSV' }).click();
	const file = await (await download).path();
	const { readFileSync } = await import('node:fs');
	const csv = readFileSync(file, 'utf8');
	expect(csv.split('\r\n')[0]).toBe('when_utc,who,subject,action,field,before,after');
	expect(csv).toContain('Morgan Reyes');
	expect(csv).toContain('Fan deck grating replaced 2026');
	expect(csv).not.toContain('Ines Halvorsen');
});
