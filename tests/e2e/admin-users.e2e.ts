import { expect, test } from './fixtures.ts';
import { signIn } from './helpers.ts';

test.describe('Admin → Users', () => {
	test('an admin creates a user with field messages for bad input, changes the role, resets the password and disables the account', async ({
		page,
		browser
	}) => {
		await signIn(page, 'admin');
		await page.goto('/admin/users');
		const form = page.locator('form[action="?/create"]');
		await form.getByLabel('Name', { exact: true }).fill('X');
		await form.getByLabel('E-mail', { exact: true }).fill('not-an-email');
		await form.getByLabel(/Initial password/).fill('short');
		await form.getByRole('button', { name: 'Create user' }).click();
		await expect(form.getByText('Enter the full name (at least 2 characters).')).toBeVisible();
		await expect(form.getByText(/Enter a valid e-mail address/)).toBeVisible();
		await expect(form.getByText('Use at least 10 characters.')).toBeVisible();

		const email = `new-tech-${Date.now()}@example.com`;
		await form.getByLabel('Name', { exact: true }).fill('Rosa Lindqvist');
		await form.getByLabel('E-mail', { exact: true }).fill(email);
		await form.getByLabel('Role').selectOption('technician');
		await form.getByLabel(/Initial password/).fill('first-pass-123');
		await form.getByLabel('Kettle River Water Works').check();
		await form.getByRole('button', { name: 'Create user' }).click();
		await expect(page.getByText(`Account for ${email} created.`)).toBeVisible();

		const row = page.locator(`[data-testid="user-row"][data-email="${email}"]`);
		await row.getByLabel('Role of Rosa Lindqvist').selectOption('supervisor');
		await row.getByRole('button', { name: 'Save role and sites' }).click();
		await expect(row.getByText('Saved.')).toBeVisible();
		await page.reload();
		await expect(row.getByLabel('Role of Rosa Lindqvist')).toHaveValue('supervisor');

		await row.getByLabel('New password for Rosa Lindqvist').fill('second-pass-456');
		await row.getByRole('button', { name: 'Reset password' }).click();
		await expect(row.getByText(/Password reset/)).toBeVisible();

		// the new password works in a separate browser
		const other = await browser.newContext();
		const p2 = await other.newPage();
		await p2.goto('/login');
		await p2.getByLabel('E-mail', { exact: true }).fill(email);
		await p2.getByLabel('Password').fill('second-pass-456');
		await p2.getByRole('button', { name: 'Sign in' }).click();
		await expect(p2.getByTestId('user-name')).toHaveText('Rosa Lindqvist');

		await row.getByRole('button', { name: 'Disable account' }).click();
		await expect(row.getByText(/Account disabled/)).toBeVisible();
		// the disabled user's open session ends
		await p2.goto('/board');
		await expect(p2).toHaveURL(/\/login/);
		await other.close();
	});

	test('the last active admin cannot be disabled', async ({ page }) => {
		await signIn(page, 'admin');
		await page.goto('/admin/users');
		const row = page.locator('[data-testid="user-row"][data-email="admin@example.com"]');
		await row.getByRole('button', { name: 'Disable account' }).click();
		await expect(row.getByRole('alert')).toHaveText(
			'This is the last active admin: make another user admin first.'
		);
	});
});
