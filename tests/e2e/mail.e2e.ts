import { expect, test } from './fixtures.ts';
import { signIn } from './helpers.ts';

test('an admin sees how mail is sent and sends a test message, which the local catcher receives', async ({
	page
}) => {
	await signIn(page, 'admin');
	await page.goto('/admin/mailbox');
	const settings = page.getByTestId('mail-settings');
	// the Playwright server has no SMTP_HOST: the local catcher on SMTP_PORT 2626
	await expect(settings).toContainText('the local mail catcher on 127.0.0.1:2626');
	await expect(settings).toContainText('Detune <detune@example.com>');

	await settings.getByLabel('Send a test message to').fill('not an address');
	await settings.getByRole('button', { name: 'Send test message' }).click();
	await expect(settings.getByText(/Enter a valid e-mail address/)).toBeVisible();

	const to = `mail-check-${Date.now()}@example.com`;
	await settings.getByLabel('Send a test message to').fill(to);
	await settings.getByRole('button', { name: 'Send test message' }).click();
	await expect(settings.getByRole('status')).toHaveText(`Test message sent to ${to}.`);
	await expect
		.poll(async () => {
			await page.reload();
			return page.getByTestId('message').filter({ hasText: to }).count();
		})
		.toBe(1);
	await expect(page.getByTestId('message').filter({ hasText: to })).toContainText(
		'Detune: test message'
	);
});
