import { expect, test, type Page } from '@playwright/test';
import { signIn, signInApi, ORIGIN } from './helpers.ts';

/** Waits until the service worker controls the page (domain of ../shared/toolchain.md, pitfall 4). */
async function swReady(page: Page) {
	await page.evaluate(async () => {
		await navigator.serviceWorker.ready;
		if (!navigator.serviceWorker.controller) await new Promise((r) => navigator.serviceWorker.addEventListener('controllerchange', r, { once: true }));
	});
	await expect.poll(() => page.evaluate(async () => `${(await navigator.serviceWorker.getRegistration())?.active?.state} ${!!navigator.serviceWorker.controller}`)).toBe('activated true');
}

async function openFieldOnline(page: Page) {
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

async function pickAsset(page: Page, tag: string) {
	await page.getByLabel('Search by tag or name').fill(tag);
	await page.getByTestId('asset-list').getByRole('button', { name: new RegExp(tag) }).click();
	await expect(page.getByTestId('asset-heading')).toContainText(tag);
}

async function typeMode(page: Page, hz: string, zeta = '') {
	await page.getByLabel(/^Natural frequency/).fill(hz);
	await page.getByLabel(/^Damping ratio/).fill(zeta);
	await page.getByRole('button', { name: 'Add natural frequency' }).click();
}

async function outboxCount(page: Page) {
	return Number(await page.getByTestId('outbox-count').innerText());
}

test.describe('Floor check offline', () => {
	test('three checks saved offline survive a reload and a closed tab, then sync once with the server’s verdicts', async ({ page, context, browser }) => {
		await openFieldOnline(page);
		await context.setOffline(true);
		await page.reload();
		await expect(page.getByTestId('asset-list').getByRole('button').first()).toBeVisible();
		const verdicts: Record<string, string> = {};

		// 1: typed modes
		await pickAsset(page, 'KRW-HLP-201');
		await page.getByLabel(/^Measured running speed/).fill('1185');
		await typeMode(page, '27.4', '0.04');
		await typeMode(page, '58', '');
		verdicts['KRW-HLP-201'] = (await page.getByTestId('verdict').locator('[data-verdict]').first().getAttribute('data-verdict'))!;
		await expect(page.getByTestId('interference-diagram')).toBeVisible();
		await expect(page.getByTestId('cautions')).toBeVisible();
		await page.getByRole('button', { name: 'Save check' }).click();
		await expect(page.getByTestId('saved-message')).toContainText('KRW-HLP-201');

		// 2: from the estimate calculator (static deflection of 6 mm ≈ 6.43 Hz)
		await pickAsset(page, 'KRW-SLP-601');
		await page.getByLabel(/^Measured running speed/).fill('620');
		await page.getByRole('tab', { name: 'Estimate' }).click();
		await page.getByLabel('Structure').selectOption('static');
		await page.getByLabel(/^Static deflection/).fill('6');
		await expect(page.getByTestId('estimate-result')).toContainText('6.43 Hz');
		await page.getByRole('button', { name: 'Add 6.43 Hz' }).click();
		await expect(page.getByTestId('modes-list')).toContainText('6.43 Hz');
		verdicts['KRW-SLP-601'] = (await page.getByTestId('verdict').locator('[data-verdict]').first().getAttribute('data-verdict'))!;
		await page.getByRole('button', { name: 'Save check' }).click();

		// 3: in conflict — a mode right on running speed
		await pickAsset(page, 'KRW-RWP-101');
		await page.getByLabel(/^Measured running speed/).fill('1032');
		await typeMode(page, '17.2', '0.021');
		await expect(page.getByTestId('verdict').locator('[data-verdict]').first()).toHaveAttribute('data-verdict', 'conflict');
		verdicts['KRW-RWP-101'] = 'conflict';
		await expect(page.getByTestId('bands')).toContainText('Drive Hz');
		await page.getByRole('button', { name: 'Save check' }).click();
		await expect.poll(() => outboxCount(page)).toBe(3);

		// close the tab, open a new one, still offline
		await page.close();
		const again = await context.newPage();
		await again.goto('/field');
		await expect.poll(() => outboxCount(again)).toBe(3);

		// back online: sync (and keep what the tablet sent, to replay it)
		const sent: unknown[] = [];
		again.on('request', (r) => {
			if (r.url().endsWith('/api/sync/push')) sent.push(...(r.postDataJSON() as { items: unknown[] }).items);
		});
		await context.setOffline(false);
		await again.getByRole('button', { name: 'Sync now' }).click();
		await expect.poll(() => outboxCount(again), { timeout: 20_000 }).toBe(0);

		// the server holds exactly those three, with verdicts equal to the device's
		const api = await browser.newContext({ baseURL: ORIGIN });
		await signInApi(api.request, 'supervisor');
		const latest = await (await api.request.get('/api/checks/latest')).json();
		const mine = latest.checks.filter((c: { tag: string }) => Object.keys(verdicts).includes(c.tag));
		expect(mine).toHaveLength(3);
		for (const c of mine) expect(c.verdict, c.tag).toBe(verdicts[c.tag]);
		expect(mine.every((c: { resultDiffers: boolean }) => c.resultDiffers === false)).toBe(true);

		// pushing the same batch again changes nothing
		const items = sent;
		expect(items).toHaveLength(3);
		const tech = await browser.newContext({ baseURL: ORIGIN });
		await signInApi(tech.request, 'technician');
		const replay = await tech.request.post('/api/sync/push', { data: { clientId: 'replay', items }, headers: { origin: ORIGIN } });
		expect((await replay.json()).results.map((r: { status: string }) => r.status)).toEqual(['duplicate', 'duplicate', 'duplicate']);
		const after = await (await api.request.get('/api/checks/latest')).json();
		expect(after.checks.filter((c: { tag: string }) => Object.keys(verdicts).includes(c.tag))).toHaveLength(3);
		await api.close();
		await tech.close();
	});
});
