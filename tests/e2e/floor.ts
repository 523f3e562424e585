/** Floor check steps shared by the end-to-end tests. */
import { expect, type Page } from '@playwright/test';
import { signIn } from './helpers.ts';

/** Waits until the service worker controls the page (domain of ../shared/toolchain.md, pitfall 4). */
export async function swReady(page: Page) {
	await page.evaluate(async () => {
		await navigator.serviceWorker.ready;
		if (!navigator.serviceWorker.controller)
			await new Promise((r) =>
				navigator.serviceWorker.addEventListener('controllerchange', r, { once: true })
			);
	});
	await expect
		.poll(() =>
			page.evaluate(
				async () =>
					`${(await navigator.serviceWorker.getRegistration())?.active?.state} ${!!navigator.serviceWorker.controller}`
			)
		)
		.toBe('activated true');
}

export async function openFieldOnline(page: Page) {
	await signIn(page, 'technician');
	await page.goto('/field');
	await swReady(page);
	// the first pull fills the tablet's asset list
	await expect(page.getByTestId('asset-list').getByRole('button').first()).toBeVisible();
	await expect(page.getByTestId('last-pull')).not.toHaveText('never');
	// load the page once more under the service worker so its cache holds Floor check
	await page.reload();
	await expect(page.getByTestId('asset-list').getByRole('button').first()).toBeVisible();
}

export async function pickAsset(page: Page, tag: string) {
	await page.getByLabel('Search by tag or name').fill(tag);
	await page
		.getByTestId('asset-list')
		.getByRole('button', { name: new RegExp(tag) })
		.click();
	await expect(page.getByTestId('asset-heading')).toContainText(tag);
}

export async function typeMode(page: Page, hz: string, zeta = '') {
	await page.getByLabel(/^Natural frequency/).fill(hz);
	await page.getByLabel(/^Damping ratio/).fill(zeta);
	await page.getByRole('button', { name: 'Add natural frequency' }).click();
}

export async function outboxCount(page: Page) {
	return Number(await page.getByTestId('outbox-count').innerText());
}

/** Saves `n` typed checks on the open Floor check page. */
export async function saveChecks(page: Page, tags: string[]) {
	for (const tag of tags) {
		await pickAsset(page, tag);
		await page.getByLabel(/^Measured running speed/).fill('1185');
		await typeMode(page, '33.3', '0.02');
		await page.getByRole('button', { name: 'Save check' }).click();
		await expect(page.getByTestId('saved-message')).toContainText(tag);
	}
}
