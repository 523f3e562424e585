import { expect, test } from './fixtures.ts';
import { navFor } from '../../src/lib/access.ts';
import { ROLES } from '../../src/lib/roles.ts';
import { demoUser, signIn } from './helpers.ts';

test.describe('signing in', () => {
	for (const role of ROLES) {
		test(`the demo ${role} signs in and sees their own navigation`, async ({ page }) => {
			await signIn(page, role);
			await expect(page.getByTestId('user-role')).toHaveText(new RegExp(role, 'i'));
			const labels = await page.getByTestId('main-nav').getByRole('link').allInnerTexts();
			expect(labels.map((l) => l.trim())).toEqual(navFor(role).map((n) => n.label));
		});
	}

	test('a wrong password and an unknown address get the same generic message', async ({ page }) => {
		await page.goto('/login');
		await page.getByLabel('E-mail').fill(demoUser('technician').email);
		await page.getByLabel('Password').fill('not-the-password');
		await page.getByRole('button', { name: 'Sign in' }).click();
		const message = await page.getByTestId('sign-in-error').innerText();
		expect(message).toBe('That e-mail and password do not match an active account.');
		await page.getByLabel('E-mail').fill('nobody-here@example.com');
		await page.getByLabel('Password').fill('not-the-password');
		await page.getByRole('button', { name: 'Sign in' }).click();
		await expect(page.getByTestId('sign-in-error')).toHaveText(message);
	});

	test('after sign-out the app pages send you to sign in', async ({ page }) => {
		await signIn(page, 'supervisor');
		await page.getByRole('button', { name: 'Sign out' }).click();
		await expect(page).toHaveURL(/\/login/);
		for (const path of ['/board', '/field', '/follow-ups', '/admin/users']) {
			await page.goto(path);
			await expect(page, path).toHaveURL(
				new RegExp(`/login\\?next=${encodeURIComponent(path).replace(/[/]/g, '\\/')}`)
			);
		}
	});

	test('the session cookie is HttpOnly and SameSite=Lax', async ({ page, context }) => {
		await signIn(page, 'planner');
		const cookie = (await context.cookies()).find((c) => c.name === 'detune_session');
		expect(cookie?.httpOnly).toBe(true);
		expect(cookie?.sameSite).toBe('Lax');
	});
});

test.describe('the look', () => {
	test('uses Inter, shipped with the app, and touch targets of at least 44 px', async ({
		page
	}) => {
		const fontRequests: string[] = [];
		page.on('request', (r) => {
			if (/\.woff2?$/.test(r.url())) fontRequests.push(r.url());
		});
		await signIn(page, 'admin');
		const family = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
		expect(family).toMatch(/^Inter/);
		await page.evaluate(() => document.fonts.ready);
		expect(await page.evaluate(() => document.fonts.check('16px Inter'))).toBe(true);
		for (const url of fontRequests) expect(url.startsWith('http://127.0.0.1:4173/')).toBe(true);
		const small = await page.evaluate(() =>
			[
				...document.querySelectorAll(
					'header a, header button, main button, main input, main select'
				)
			]
				.map((el) => ({
					el: (el as HTMLElement).innerText || el.getAttribute('name') || el.tagName,
					h: el.getBoundingClientRect().height
				}))
				.filter((x) => x.h > 0 && x.h < 44)
		);
		expect(small).toEqual([]);
	});
});
