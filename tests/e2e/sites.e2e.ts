import { type Page } from '@playwright/test';
import { expect, test } from './fixtures.ts';
import { signIn } from './helpers.ts';

const staleCount = async (page: Page) =>
	Number((await page.getByTestId('stale-count').innerText()).split(' ')[0]);

test('an admin shortens a site’s recheck interval and the board flags its checks stale at once; areas are added and renamed', async ({
	page
}) => {
	await signIn(page, 'admin');
	await page.goto('/admin/sites');
	const row = page.locator('[data-testid="site-row"][data-code="LBM"]');
	await expect(row).toBeVisible();
	const siteForm = row.locator('form[action="?/updateSite"]');
	const interval = siteForm.getByLabel(/Recheck interval/);
	const original = await interval.inputValue();

	// a bad value gets its message and nothing is saved
	await interval.fill('2.5');
	await siteForm.getByRole('button', { name: 'Save site' }).click();
	await expect(siteForm.getByText('Recheck interval: a whole number of days.')).toBeVisible();
	await expect(page.getByTestId('form-problems')).toContainText('Recheck interval');

	// the board before, for Larkspur only
	const lbmId = await row.locator('input[name="id"]').first().inputValue();
	await page.goto(`/board?site=${lbmId}`);
	const before = await staleCount(page);

	await page.goto('/admin/sites');
	await interval.fill('7');
	await siteForm.getByRole('button', { name: 'Save site' }).click();
	await expect(row.getByText(/Saved; the stale date of \d+ assets? moved/)).toBeVisible();
	await page.goto(`/board?site=${lbmId}`);
	await expect.poll(() => staleCount(page)).toBeGreaterThan(before);

	// areas
	await page.goto('/admin/sites');
	const name = `Boiler house ${Date.now() % 100000}`;
	await row.getByLabel('New area').fill(name);
	await row.getByRole('button', { name: 'Add area' }).click();
	await expect(row.getByText(`Area ${name} added.`)).toBeVisible();
	await row.getByLabel('New area').fill(name.toLowerCase());
	await row.getByRole('button', { name: 'Add area' }).click();
	await expect(row.getByText(/already has an area called/).first()).toBeVisible();
	const renamed = row.locator(`[data-testid="area-row"][data-name="${name}"]`);
	await renamed.getByLabel('Area name').fill(`${name} east`);
	await renamed.getByRole('button', { name: 'Rename' }).click();
	await expect(row.getByText('Area renamed.')).toBeVisible();
	await page.reload();
	await expect(row.locator(`[data-testid="area-row"][data-name="${name} east"]`)).toBeVisible();

	// the audit log has both changes
	await page.goto('/admin/audit');
	await expect(page.getByText('rename area').first()).toBeVisible();

	// put the interval back
	await page.goto('/admin/sites');
	await interval.fill(original);
	await siteForm.getByRole('button', { name: 'Save site' }).click();
	await expect(row.getByText(/Saved/)).toBeVisible();
	await page.goto(`/board?site=${lbmId}`);
	await expect.poll(() => staleCount(page)).toBe(before);
});

test('a supervisor does not reach the sites screen', async ({ page }) => {
	await signIn(page, 'supervisor');
	const res = await page.goto('/admin/sites');
	expect(res?.status()).toBe(403);
});
