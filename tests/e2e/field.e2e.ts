import { chromium, type Page } from '@playwright/test';
import { expect, test } from './fixtures.ts';
import { signIn, signInApi, ORIGIN } from './helpers.ts';
import { openFieldOnline, outboxCount, pickAsset, saveChecks, typeMode, syncAll } from './floor.ts';
import { CHROMIUM, CHROMIUM_ARGS } from '../support/chromium.ts';

/** A browser profile on disk, so that a test can close the browser and start it again. */
function launchProfile(dir: string) {
	return chromium.launchPersistentContext(dir, {
		executablePath: CHROMIUM,
		baseURL: ORIGIN,
		serviceWorkers: 'allow',
		viewport: { width: 1024, height: 768 },
		args: CHROMIUM_ARGS
	});
}

const verdictShown = async (page: Page) =>
	(await page
		.getByTestId('verdict')
		.locator('[data-verdict]')
		.first()
		.getAttribute('data-verdict'))!;

test.describe('Floor check offline', () => {
	test('one online visit is enough: ready offline, then reload, a new tab and a browser restart open Floor check; three checks saved offline sync once each', async ({
		browser
	}, testInfo) => {
		test.setTimeout(120_000);
		const dir = testInfo.outputPath('profile');
		let context = await launchProfile(dir);
		let page = context.pages()[0] ?? (await context.newPage());
		// the first and only online visit
		await openFieldOnline(page);
		await context.setOffline(true);

		await page.reload();
		await expect(page.getByTestId('asset-list').getByRole('button').first()).toBeVisible();
		const tab = await context.newPage();
		await tab.goto('/field');
		await expect(tab.getByTestId('asset-list').getByRole('button').first()).toBeVisible();
		await tab.close();
		const verdicts: Record<string, string> = {};

		// 1: typed modes
		await pickAsset(page, 'KRW-HLP-201');
		await page.getByLabel(/^Measured running speed/).fill('1185');
		await typeMode(page, '27.4', '0.04');
		await typeMode(page, '58', '');
		verdicts['KRW-HLP-201'] = await verdictShown(page);
		await expect(page.getByTestId('interference-diagram')).toBeVisible();
		await expect(page.getByTestId('cautions')).toBeVisible();
		await page.getByRole('button', { name: 'Save check' }).click();
		await expect(page.getByTestId('saved-message')).toContainText('KRW-HLP-201');

		// 2: from the estimate calculator (static deflection of 6 mm ≈ 6.43 Hz, domain E3)
		await pickAsset(page, 'KRW-SLP-601');
		await page.getByLabel(/^Measured running speed/).fill('620');
		await page.getByRole('tab', { name: 'Estimate from the structure' }).click();
		await page.getByLabel('Structure', { exact: true }).selectOption('static');
		await page.getByLabel(/^Static deflection/).fill('6');
		await expect(page.getByTestId('estimate-result')).toContainText('6.43 Hz');
		await page.getByRole('button', { name: 'Add 6.43 Hz' }).click();
		await expect(page.getByTestId('modes-list')).toContainText('6.43 Hz');
		verdicts['KRW-SLP-601'] = await verdictShown(page);
		await page.getByRole('button', { name: 'Save check' }).click();
		await expect(page.getByTestId('saved-message')).toContainText('KRW-SLP-601');

		// 3: in conflict — a mode right on running speed
		await pickAsset(page, 'KRW-RWP-101');
		await page.getByLabel(/^Measured running speed/).fill('1032');
		await typeMode(page, '17.2', '0.021');
		await expect(page.getByTestId('verdict').locator('[data-verdict]').first()).toHaveAttribute(
			'data-verdict',
			'conflict'
		);
		await expect(
			page.getByTestId('bar-verdict-at-speed').locator('[data-verdict]')
		).toHaveAttribute('data-verdict', 'conflict');
		verdicts['KRW-RWP-101'] = 'conflict';
		await expect(page.getByTestId('bands')).toContainText('Drive Hz');
		await page.getByRole('button', { name: 'Save check' }).click();
		// the technician sees the confirmation (the tablet has finished writing) before closing
		await expect(page.getByTestId('saved-message')).toContainText('KRW-RWP-101');
		await expect.poll(() => outboxCount(page)).toBe(3);

		// the browser is closed and started again, still with no network
		await context.close();
		context = await launchProfile(dir);
		await context.setOffline(true);
		page = context.pages()[0] ?? (await context.newPage());
		await page.goto('/field');
		await expect(page.getByTestId('asset-list').getByRole('button').first()).toBeVisible();
		await expect.poll(() => outboxCount(page)).toBe(3);
		await expect(page.getByTestId('recent-checks')).toContainText('KRW-RWP-101');

		// back online: each check reaches the server once (keep what the tablet sent, to replay it)
		const sent: unknown[] = [];
		page.on('request', (r) => {
			if (r.url().endsWith('/api/sync/push'))
				sent.push(...(r.postDataJSON() as { items: unknown[] }).items);
		});
		await context.setOffline(false);
		await syncAll(page);
		await context.close();
		expect(sent).toHaveLength(3);

		// the server holds exactly those three, with verdicts equal to the device's
		const api = await browser.newContext({ baseURL: ORIGIN });
		await signInApi(api.request, 'supervisor');
		const latest = await (await api.request.get('/api/checks/latest')).json();
		const mine = latest.checks.filter((c: { tag: string }) =>
			Object.keys(verdicts).includes(c.tag)
		);
		expect(mine).toHaveLength(3);
		for (const c of mine) expect(c.verdict, c.tag).toBe(verdicts[c.tag]);
		expect(mine.every((c: { resultDiffers: boolean }) => c.resultDiffers === false)).toBe(true);

		// pushing the same batch again changes nothing
		const tech = await browser.newContext({ baseURL: ORIGIN });
		await signInApi(tech.request, 'technician');
		const replay = await tech.request.post('/api/sync/push', {
			data: { clientId: 'replay', items: sent },
			headers: { origin: ORIGIN }
		});
		expect((await replay.json()).results.map((r: { status: string }) => r.status)).toEqual([
			'duplicate',
			'duplicate',
			'duplicate'
		]);
		await api.close();
		await tech.close();

		// a supervisor sees the synced checks
		const sup = await browser.newContext();
		const sp = await sup.newPage();
		await signIn(sp, 'supervisor');
		for (const tag of Object.keys(verdicts)) {
			await sp.goto(`/board?q=${tag}`);
			const row = sp.locator(`[data-testid="board-row"][data-tag="${tag}"]`);
			await expect(row.locator('[data-verdict]').first()).toHaveAttribute(
				'data-verdict',
				verdicts[tag]
			);
		}
		await sup.close();
	});

	test('the connection drops during a push: nothing lost, nothing doubled', async ({
		page,
		context,
		browser
	}) => {
		await openFieldOnline(page);
		await context.setOffline(true);
		await saveChecks(page, ['KRW-SWP-305', 'KRW-AB-401']);
		const ids: string[] = [];
		let dropped = false;
		await page.route('**/api/sync/push', async (route) => {
			const body = route.request().postDataJSON() as { items: { id: string }[] };
			ids.push(...body.items.map((i) => i.id));
			if (dropped) return route.continue();
			dropped = true;
			await route.fetch(); // the server stores the batch …
			await route.abort('connectionreset'); // … but the answer never reaches the tablet
		});
		await context.setOffline(false);
		await expect(page.getByTestId('sync-state')).toHaveText('Sync failed');
		await expect.poll(() => outboxCount(page)).toBe(2);
		await syncAll(page);
		const api = await browser.newContext({ baseURL: ORIGIN });
		await signInApi(api.request, 'supervisor');
		const all = await (await api.request.get('/api/checks/latest')).json();
		const stored = all.checks.filter((c: { id: string }) => ids.includes(c.id));
		expect(new Set(ids).size).toBe(2);
		expect(stored).toHaveLength(2);
		await api.close();
	});

	test('a new app version arrives while two checks wait: the update waits for a yes, and both checks are still there and sync', async ({
		page,
		context
	}) => {
		await openFieldOnline(page);
		await context.setOffline(true);
		await saveChecks(page, ['KRW-AB-402', 'KRW-AB-403']);
		// the checks cannot leave yet (the server is unreachable), but the page is online
		await page.route('**/api/sync/push', (route) => route.abort('connectionrefused'));
		await context.setOffline(false);
		// a new release: the service worker is replaced by another script (here the same build under
		// a new URL, which the browser installs as a new worker that then waits)
		await page.evaluate(async () => {
			await navigator.serviceWorker.register('/sw.js?release=next', { scope: '/' });
		});
		await expect(page.getByTestId('update-prompt')).toBeVisible();
		// nothing happens until the technician says yes
		await page.waitForTimeout(1000);
		await expect(page.getByTestId('update-prompt')).toBeVisible();
		await expect.poll(() => outboxCount(page)).toBe(2);
		await page.getByRole('button', { name: 'Update now' }).click();
		await page.waitForLoadState('load');
		await expect.poll(() => outboxCount(page)).toBe(2);
		await page.unroute('**/api/sync/push');
		await syncAll(page);
	});

	test('a session that expired offline asks for sign-in and loses nothing', async ({
		page,
		context
	}) => {
		await openFieldOnline(page);
		await context.setOffline(true);
		await saveChecks(page, ['KRW-AB-404']);
		await context.clearCookies();
		await context.setOffline(false);
		await expect(page.getByTestId('sync-state')).toHaveText('Sign in to sync');
		await expect.poll(() => outboxCount(page)).toBe(1);
		await page.getByRole('link', { name: 'Sign in' }).click();
		await page.getByLabel('E-mail').fill('tech@example.com');
		await page.getByLabel('Password').fill('tech-demo-2026');
		await page.getByRole('button', { name: 'Sign in' }).click();
		await expect(page).toHaveURL(/\/field/);
		await expect.poll(() => outboxCount(page), { timeout: 20_000 }).toBe(0);
	});
});
