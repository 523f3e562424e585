/**
 * A shift on a shared tablet: two technicians of different sites in one browser, drafts that
 * survive what a plant floor does to them, and a Floor check usable with gloves.
 */
import AxeBuilder from '@axe-core/playwright';
import { type Page } from '@playwright/test';
import { expect, test } from './fixtures.ts';
import { demoUser, ORIGIN, signIn, signInApi } from './helpers.ts';
import { DEMO_PASSWORDS, DEMO_USERS } from '../../src/lib/server/db/demo-data.ts';
import { openFieldOnline, outboxCount, pickAsset, typeMode, waitReadyOffline } from './floor.ts';

async function signOutFromHeader(page: Page) {
	await page.getByRole('button', { name: 'Sign out' }).first().click();
}

test('two technicians share a tablet: each sees only their own site and outbox, and a waiting check goes out under its author', async ({
	page,
	browser
}) => {
	test.setTimeout(90_000);
	const first = demoUser('technician');
	// Tomas (Kettle River) saves a check while the server cannot be reached
	await openFieldOnline(page, 'technician');
	await page.route('**/api/sync/push', (route) => route.abort('connectionrefused'));
	await pickAsset(page, 'KRW-RWP-104');
	await page.getByLabel(/^Measured running speed/).fill('1111');
	await typeMode(page, '41.7', '0.03');
	await page.getByRole('button', { name: 'Save check' }).click();
	await expect.poll(() => outboxCount(page)).toBe(1);

	// signing out says what waits and keeps it under its author
	await signOutFromHeader(page);
	const dialog = page.getByTestId('sign-out-dialog');
	await expect(dialog).toContainText('1 check waits to sync');
	await expect(dialog).toContainText('under your name');
	await dialog.getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/login/);
	await page.unroute('**/api/sync/push');

	// Ines (Larkspur) signs in on the same tablet: her site only, an empty outbox
	const second = DEMO_USERS.find((u) => u.email === 'tech2@example.com')!;
	await page.getByLabel('E-mail').fill(second.email);
	await page.getByLabel('Password').fill(DEMO_PASSWORDS.technician);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/field/);
	await expect(page.getByTestId('asset-list').getByRole('button').first()).toBeVisible();
	const tags = await page.getByTestId('asset-list').getByRole('button').allInnerTexts();
	expect(tags.length).toBeGreaterThan(3);
	expect(
		tags.every((t) => t.startsWith('LBM-')),
		tags.join(' | ')
	).toBe(true);
	await expect(page.getByTestId('outbox-count')).toHaveText('0');
	await page.waitForTimeout(1500); // a sync may run now: it must not carry Tomas's check
	await signOutFromHeader(page);
	await expect(page).toHaveURL(/\/login/);

	// the check is not on the server yet, under anybody's name
	const api = await browser.newContext({ baseURL: ORIGIN });
	await signInApi(api.request, 'supervisor');
	const before = (await (await api.request.get('/api/checks/latest')).json()).checks.filter(
		(c: { tag: string; measuredRpm: number }) => c.tag === 'KRW-RWP-104' && c.measuredRpm === 1111
	);
	expect(before).toEqual([]);

	// Tomas signs in again: his check goes out, under his name
	await page.getByLabel('E-mail').fill(first.email);
	await page.getByLabel('Password').fill(first.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/field/);
	const mine = async () =>
		(await (await api.request.get('/api/checks/latest')).json()).checks.filter(
			(c: { tag: string; measuredRpm: number }) => c.tag === 'KRW-RWP-104' && c.measuredRpm === 1111
		);
	await expect.poll(mine, { timeout: 20_000 }).toHaveLength(1);
	await expect.poll(() => outboxCount(page)).toBe(0);
	const after = await mine();
	expect(after).toHaveLength(1);
	expect(after[0].by).toBe(first.name);
	await api.close();
});

test('signing out offline ends the local session and shows the sign-in page from the tablet', async ({
	page,
	context
}) => {
	await openFieldOnline(page, 'technician');
	await context.setOffline(true);
	await signOutFromHeader(page);
	await expect(page).toHaveURL(/\/login/);
	await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
	// Floor check now knows nobody is signed in here
	await page.goto('/field');
	await expect(page.getByText('Nobody is signed in on this tablet')).toBeVisible();
	// back online, the server session ends at the first contact
	await context.setOffline(false);
	await page.goto('/field');
	await expect(page).toHaveURL(/\/login\?next=%2Ffield/);
	const res = await page.request.get('/api/session');
	expect(res.status()).toBe(401);
});

test('a draft survives a reload, an asset change and a visit to the board; a bad speed disables Save with the reason', async ({
	page
}) => {
	await openFieldOnline(page, 'supervisor');
	await pickAsset(page, 'KRW-RWP-103');
	const speed = page.getByLabel(/^Measured running speed/);
	await speed.fill('abc');
	const save = page.getByRole('button', { name: 'Save check' });
	await expect(save).toBeDisabled();
	await expect(page.getByTestId('save-reason')).toHaveText(
		'Running speed: enter the measured rpm as a number.'
	);
	await expect(page.locator('#rpm-err')).toBeVisible();
	await speed.fill('1185');
	await expect(page.locator('#rpm-err'), 'no stale error once the field is right').toHaveCount(0);
	await expect(page.getByTestId('save-reason')).toHaveText('Add at least one natural frequency.');
	await typeMode(page, '31.5', '0.025');
	await page.getByLabel('Notes').fill('Coupling guard loose, retorqued');
	await expect(save).toBeEnabled();

	// a reload
	await page.waitForTimeout(400);
	await page.reload();
	await expect(page.getByTestId('asset-heading')).toContainText('KRW-RWP-103');
	await expect(page.getByLabel(/^Measured running speed/)).toHaveValue('1185');
	await expect(page.getByTestId('modes-list')).toContainText('31.50 Hz');
	await expect(page.getByLabel('Notes')).toHaveValue('Coupling guard loose, retorqued');

	// another asset: its own, empty draft (the notes stay with their asset)
	await page.getByRole('button', { name: 'Change asset' }).click();
	await expect(
		page
			.getByTestId('asset-list')
			.getByRole('button', { name: /KRW-RWP-103/ })
			.getByTestId('has-draft')
	).toBeVisible();
	await pickAsset(page, 'KRW-BWP-302');
	await expect(page.getByLabel('Notes')).toHaveValue('');
	await expect(page.getByLabel(/^Measured running speed/)).toHaveValue('');

	// a visit to the board and back
	await page.getByRole('button', { name: 'Change asset' }).click();
	await pickAsset(page, 'KRW-RWP-103');
	await page.goto('/board');
	await expect(page.getByTestId('board-row').first()).toBeVisible();
	await page.goto('/field');
	await expect(page.getByTestId('asset-heading')).toContainText('KRW-RWP-103');
	await expect(page.getByTestId('modes-list')).toContainText('31.50 Hz');
	await expect(page.getByLabel('Notes')).toHaveValue('Coupling guard loose, retorqued');

	// discarding is explicit
	await page.getByRole('button', { name: 'Discard draft' }).click();
	await page.getByRole('dialog').getByRole('button', { name: 'Discard draft' }).click();
	await expect(page.getByLabel(/^Measured running speed/)).toHaveValue('');
	await expect(page.getByLabel('Notes')).toHaveValue('');
});

test('a speed far outside the asset’s range needs a confirmation before Save', async ({ page }) => {
	await openFieldOnline(page, 'technician');
	await pickAsset(page, 'KRW-RWP-102');
	await page.getByLabel(/^Measured running speed/).fill('3000');
	await typeMode(page, '22', '');
	const save = page.getByRole('button', { name: 'Save check' });
	await expect(page.getByTestId('outside-range')).toBeVisible();
	await expect(save).toBeDisabled();
	await page.getByLabel(/Yes, the machine runs at 3000 rpm/).check();
	await expect(save).toBeEnabled();
	await page.getByLabel(/^Measured running speed/).fill('3100');
	await expect(save, 'a new speed needs a new confirmation').toBeDisabled();
});

/** Every control a gloved finger may need: at least 48 × 48 CSS px. */
async function smallControls(page: Page) {
	return page.evaluate(() => {
		const sel = 'a[href], button, input:not([type=hidden]), select, textarea, summary, [role=tab]';
		return [...document.querySelectorAll<HTMLElement>(sel)]
			.filter((el) => {
				const r = el.getBoundingClientRect();
				const style = getComputedStyle(el);
				const visible = r.width > 0 && r.height > 0 && style.visibility !== 'hidden';
				const skip = el.closest('.sr-only') || el.classList.contains('sr-only');
				return visible && !skip && (r.width < 48 || r.height < 48);
			})
			.map((el) => {
				const r = el.getBoundingClientRect();
				const name = (el.getAttribute('aria-label') ?? el.textContent ?? el.id ?? '').trim();
				return `${el.tagName.toLowerCase()} "${name.slice(0, 40)}" ${Math.round(r.width)}×${Math.round(r.height)}`;
			});
	});
}

for (const [width, height] of [
	[1024, 768],
	[820, 1180]
]) {
	test(`at ${width}×${height} every Floor check control is at least 48 × 48 px and axe-core finds no serious problem`, async ({
		page
	}) => {
		await page.setViewportSize({ width, height });
		// no colour transitions half-way when axe-core measures contrast
		await page.emulateMedia({ reducedMotion: 'reduce' });
		await openFieldOnline(page, 'technician');
		await waitReadyOffline(page);
		const axe = async (what: string) => {
			const r = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa']).analyze();
			expect(
				r.violations
					.filter((v) => v.impact === 'serious' || v.impact === 'critical')
					.map(
						(v) => `${what}: ${v.id} ${v.help} ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`
					)
			).toEqual([]);
		};
		expect(await smallControls(page), 'asset list').toEqual([]);
		await axe('asset list');
		await pickAsset(page, 'KRW-RWP-101');
		await page.getByLabel(/^Measured running speed/).fill('1032');
		await typeMode(page, '17.2', '0.021');
		await typeMode(page, '44', '0.03');
		await page.getByRole('button', { name: /Show all \d+ pairs/ }).click();
		for (const tab of [
			'Estimate from the structure',
			'Load a bump-test file',
			'Type frequencies'
		]) {
			await page.getByRole('tab', { name: tab }).click();
			expect(await smallControls(page), tab).toEqual([]);
		}
		await axe('check');
		// the header does not wrap: one row
		const header = await page.locator('header').boundingBox();
		expect(header!.height).toBeLessThan(80);
		// nothing wider than the screen
		expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
			width
		);
	});
}

test('the verdict mark differs in shape per verdict, and the word is always beside it', async ({
	page
}) => {
	await signIn(page, 'supervisor');
	await page.goto('/board');
	await expect(page.getByTestId('board-row').first()).toBeVisible();
	const marks = await page.locator('[data-verdict]').evaluateAll((els) =>
		els.map((el) => ({
			verdict: el.getAttribute('data-verdict'),
			text: el.textContent?.trim().toLowerCase(),
			shape: el.querySelector('svg[data-mark]')?.innerHTML.replace(/id="[^"]*"|url\(#[^)]*\)/g, '')
		}))
	);
	const byVerdict = new Map<string, Set<string>>();
	for (const m of marks) {
		expect(m.text).toContain(m.verdict);
		byVerdict.set(m.verdict!, (byVerdict.get(m.verdict!) ?? new Set()).add(m.shape!));
	}
	expect(byVerdict.size).toBeGreaterThanOrEqual(3);
	const shapes = [...byVerdict.values()].map((s) => [...s][0]);
	expect(new Set(shapes).size, 'one distinct shape per verdict').toBe(byVerdict.size);
});
