import { expect, test } from '@playwright/test';
import { signIn } from './helpers.ts';

test('a supervisor edits a demo rule set with one per-kind margin and saves it', async ({
	page
}) => {
	await signIn(page, 'supervisor');
	await page.goto('/rule-sets');
	const card = page
		.getByTestId('rule-set')
		.filter({ has: page.getByRole('heading', { name: /Pump structures 15 %, vane pass 20 %/ }) });
	await expect(card).toBeVisible();
	// the demo's own rule set has only some per-kind margins: change the required margin and save
	await card.getByLabel('Required margin').fill('16');
	await card.getByRole('button', { name: 'Save rule set' }).click();
	await expect(card.getByRole('status')).toContainText('Saved;');
	await expect(card.getByRole('alert')).toHaveCount(0);
	await page.reload();
	await expect(card.getByLabel('Required margin')).toHaveValue('16');
	// and back, so other tests see the demo as it was
	await card.getByLabel('Required margin').fill('15');
	await card.getByRole('button', { name: 'Save rule set' }).click();
	await expect(card.getByRole('status')).toContainText('Saved;');
});
