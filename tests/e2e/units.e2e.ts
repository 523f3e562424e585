import { type Page } from '@playwright/test';
import { expect, test } from './fixtures.ts';
import { signIn } from './helpers.ts';

async function chooseUnits(page: Page, label: RegExp) {
	await page.getByTestId('user-name').click();
	await expect(page).toHaveURL(/\/settings$/);
	await page.getByLabel(label).check();
	await page.getByRole('button', { name: 'Save units' }).click();
	await expect(page.getByRole('status')).toContainText('Saved');
}

test('a supervisor who works in inches sees and enters bearing diameters in inches; they are stored once, in metres', async ({
	page
}) => {
	await signIn(page, 'supervisor');
	await chooseUnits(page, /US customary/);
	try {
		await page.goto('/board?q=KRW-BWP-301');
		await page.getByRole('link', { name: 'KRW-BWP-301' }).click();
		await expect(page).toHaveURL(/\/assets\//);
		const sheet = page.url();
		const bearing = page.locator('[data-testid="source"][data-kind="bearing"]').first();
		const pitch = bearing.getByLabel(/Pitch diameter/);
		// the demo's 115 mm, in inches (115 / 25.4)
		await expect(bearing.getByText('Pitch diameter (in)')).toBeVisible();
		await expect(pitch).toHaveValue('4.527559055');
		await expect(bearing.getByLabel(/Element diameter/)).toHaveValue('1');
		await pitch.fill('4.5');
		await bearing.getByRole('button', { name: 'Save' }).click();
		await expect(bearing.getByText(/Saved; margins recomputed/)).toBeVisible();

		// the same value, seen by a metric user: 4.5 in = 114.3 mm
		await chooseUnits(page, /Metric/);
		await page.goto(sheet);
		await expect(bearing.getByText('Pitch diameter (mm)')).toBeVisible();
		await expect(bearing.getByLabel(/Pitch diameter/)).toHaveValue('114.3');
	} finally {
		await page.goto('/settings');
		await page.getByLabel(/Metric/).check();
		await page.getByRole('button', { name: 'Save units' }).click();
	}
});
