/** Floor check steps shared by the end-to-end tests. */
import { expect, type Page } from '@playwright/test';
import { signIn } from './helpers.ts';
import type { Role } from '../../src/lib/roles.ts';

/** Waits until the service worker controls the page (../shared/toolchain.md, pitfall 4). */
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

/** What a technician waits for before walking out of coverage: the page says it is ready. */
export async function waitReadyOffline(page: Page) {
	await expect(page.getByTestId('ready-offline')).toHaveAttribute('data-ready', 'true', {
		timeout: 30_000
	});
}

/**
 * Signs in and opens Floor check once, as a person would, and waits until it says "Ready offline".
 * No second load: the page must be ready for offline use from this first visit.
 */
export async function openFieldOnline(page: Page, role: Role = 'technician') {
	await signIn(page, role);
	if (!/\/field/.test(page.url())) await page.goto('/field');
	await expect(page.getByTestId('asset-list').getByRole('button').first()).toBeVisible();
	await waitReadyOffline(page);
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

/** Sync now, as the technician taps it, and wait until the outbox is empty. */
export async function syncAll(page: Page) {
	await page.getByRole('button', { name: 'Sync now' }).click();
	await expect.poll(() => outboxCount(page), { timeout: 20_000 }).toBe(0);
}

/** Saves `n` typed checks on the open Floor check page. */
export async function saveChecks(page: Page, tags: string[]) {
	for (const tag of tags) {
		await pickAsset(page, tag);
		await page.getByLabel(/^Measured running speed/).fill('1185');
		await typeMode(page, '33.3', '0.02');
		// a blower at a pump's speed: the technician confirms the reading, as the screen asks
		const confirm = page.getByLabel(/Yes, the machine runs at/);
		if (await confirm.isVisible()) await confirm.check();
		await page.getByRole('button', { name: 'Save check' }).click();
		await expect(page.getByTestId('saved-message')).toContainText(tag);
	}
}
