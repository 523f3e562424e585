import { expect, test } from './fixtures.ts';
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

test('a supervisor starts a rule set from API 610’s vertical-pump rule, with its source and edition, and creates it', async ({
	page
}) => {
	await signIn(page, 'supervisor');
	await page.goto('/rule-sets');
	await page.getByRole('link', { name: 'API 610 vertical pump driver support, 20 %' }).click();
	await expect(page).toHaveURL(/from=api610-vs-20/);
	const form = page
		.getByTestId('rule-set')
		.filter({ has: page.getByRole('heading', { name: 'New rule set' }) });
	await expect(form.getByLabel('Name')).toHaveValue(
		'API 610 VS pump driver support structure 20 %'
	);
	await expect(form.getByLabel('Required margin')).toHaveValue('20');
	await expect(form.getByLabel('Source')).toHaveValue(/API 610 9\.5\.3/);
	await expect(form.getByLabel('Edition')).toHaveValue(/11th edition/);
	// the person makes it theirs before creating it
	await form.getByLabel('Name').fill('Cooling-tower VS pumps 20 % (API 610)');
	await form.getByRole('button', { name: 'Create rule set' }).click();
	const created = page.getByTestId('rule-set').filter({
		has: page.getByRole('heading', { name: /Cooling-tower VS pumps 20 % \(API 610\)/ })
	});
	await expect(created).toBeVisible();
	// the new rule set's form is empty again: no second one by a second tap
	await expect(form.getByLabel('Name')).toHaveValue('');
	await page.reload();
	await expect(created.getByLabel('Source')).toHaveValue(/API 610 9\.5\.3/);
	await expect(created.getByLabel('Required margin')).toHaveValue('20');
});
