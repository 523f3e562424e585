import { expect, test } from './fixtures.ts';
import { signIn } from './helpers.ts';

test('a supervisor reviews a check: remarks need a comment, a fine review may go without, and a review can be withdrawn the same day', async ({
	page
}) => {
	await signIn(page, 'supervisor');
	const pulled = await (await page.request.get('/api/sync/pull?since=0')).json();
	// an asset no other test reviews
	const asset = pulled.assets.find((a: { tag: string }) => a.tag === 'LBM-RF-411');
	await page.goto(`/assets/${asset.id}`);
	// one way of writing a moment: "23 Nov 2026, 11:06 UTC", the zone named (it was 11/23/2026, …)
	await expect(page.locator('tbody time').first()).toHaveText(
		/^\d{1,2} [A-Z][a-z]{2} \d{4}, \d{2}:\d{2} \S+$/
	);
	await expect(page.locator('main')).not.toContainText(/\d{1,2}\/\d{1,2}\/\d{4}/);
	// each check's notes are on the sheet (before, they were shown nowhere after sync)
	await expect(page.getByTestId('check-notes').first()).toHaveText(
		'Notes: Machine stopped and locked out for the bump test.'
	);
	// the first check in the history that awaits a review, held by its position
	const rows = page.locator('tbody tr');
	const buttons = await rows.evaluateAll((trs) =>
		trs.map((tr) => tr.textContent?.includes('Reviewed with remarks') ?? false)
	);
	const row = rows.nth(buttons.indexOf(true));
	// before, "Mark reviewed" with an empty comment was one tap and could not be undone
	await row.getByRole('button', { name: 'Reviewed with remarks' }).click();
	await expect(
		row.getByText('Comment: say what the remarks are (at least 3 characters).')
	).toBeVisible();
	await expect(row.getByTestId('review')).toHaveCount(0);
	await row.getByLabel(/Review comment/).fill('Second mode close to 2× at top speed; watch it');
	await row.getByRole('button', { name: 'Reviewed with remarks' }).click();
	await expect(row.getByTestId('review')).toContainText('Reviewed with remarks · ');
	await expect(row.getByTestId('review')).toContainText(
		'Second mode close to 2× at top speed; watch it'
	);
	await row.getByRole('button', { name: 'Withdraw review' }).click();
	await expect(row.getByRole('status')).toHaveText(
		'Review withdrawn; the check awaits a review again.'
	);
	await expect(row.getByRole('button', { name: 'Reviewed, fine' })).toBeVisible();
	// a fine review needs no comment
	await row.getByRole('button', { name: 'Reviewed, fine' }).click();
	await expect(row.getByTestId('review')).toContainText('Reviewed, fine · ');
});
