import { expect, test } from '@playwright/test';
import AxeBuilder from '@axe-core/playwright';
import { signIn } from './helpers.ts';

test.describe('security headers', () => {
	test('pages carry a CSP that forbids framing, and every answer says nosniff and a referrer policy', async ({ page }) => {
		const login = await page.goto('/login');
		const h = login!.headers();
		expect(h['content-security-policy']).toContain("frame-ancestors 'none'");
		expect(h['content-security-policy']).toContain("default-src 'self'");
		expect(h['x-content-type-options']).toBe('nosniff');
		expect(h['referrer-policy']).toBe('strict-origin-when-cross-origin');
		expect(h['x-frame-options']).toBe('DENY');
		const api = await page.request.get('/api/health');
		expect(api.headers()['x-content-type-options']).toBe('nosniff');
		expect(api.headers()['referrer-policy']).toBe('strict-origin-when-cross-origin');
	});

	test('a form post from another origin is refused (SvelteKit’s origin check is on)', async ({ request }) => {
		const res = await request.post('/login', { form: { email: 'tech@example.com', password: 'tech-demo-2026' }, headers: { origin: 'http://evil.example', accept: 'text/html' }, maxRedirects: 0 });
		expect(res.status()).toBe(403);
	});
});

test.describe('accessibility (axe-core)', () => {
	const serious = <T extends { impact?: string | null }>(v: T[]) => v.filter((x) => x.impact === 'serious' || x.impact === 'critical');
	const check = async (page: import('@playwright/test').Page, what: string) => {
		const r = await new AxeBuilder({ page }).analyze();
		expect(serious(r.violations).map((v) => `${what}: ${v.id} (${v.nodes.length}) ${v.help}`)).toEqual([]);
	};

	test('Sign in, Floor check, Margin board, asset sheet and Follow-ups have no serious or critical violations', async ({ page }) => {
		await page.goto('/login');
		await check(page, 'sign in');
		await signIn(page, 'admin');
		await page.goto('/field');
		await expect(page.getByTestId('asset-list').getByRole('button').first()).toBeVisible();
		await check(page, 'floor check');
		await page.goto('/board');
		await expect(page.getByTestId('board-row').first()).toBeVisible();
		await check(page, 'board');
		await page.getByTestId('board-row').first().getByRole('link').click();
		await expect(page.getByTestId('sheet-title')).toBeVisible();
		await check(page, 'asset sheet');
		await page.goto('/follow-ups');
		await check(page, 'follow-ups');
	});

	test('the main navigation and sign-out are reachable by keyboard', async ({ page }) => {
		await signIn(page, 'supervisor');
		await page.goto('/board');
		const reached: string[] = [];
		for (let i = 0; i < 12; i++) {
			await page.keyboard.press('Tab');
			reached.push(await page.evaluate(() => (document.activeElement as HTMLElement | null)?.innerText?.trim() ?? ''));
		}
		expect(reached.join('|')).toContain('Margin board');
		expect(reached.join('|')).toContain('Sign out');
	});
});

