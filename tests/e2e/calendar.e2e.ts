import { type Page } from '@playwright/test';
import { expect, test } from './fixtures.ts';
import { ORIGIN, signIn } from './helpers.ts';
import { addDays, mondayOf } from '../../src/lib/calendar.ts';

// The planner's week calendar: days as columns, a follow-up moved by dragging it (mouse) or by
// Move → Move here (touch, keyboard), the new date kept by the server and in the audit log. The
// follow-ups are the test's own, on an asset no other test plans for (LBM-CTF-211).

const TAG = 'LBM-CTF-211';

async function create(page: Page, assetId: string, title: string, dueDate: string) {
	await page.goto(`/follow-ups?new=${assetId}`);
	const form = page.getByTestId('new-follow-up');
	await form.getByLabel('What is to be done').fill(title);
	await form.getByLabel('Due date').fill(dueDate);
	await form.getByRole('button', { name: 'Create follow-up' }).click();
	await expect(page.locator('[data-created="true"]')).toContainText(title);
}

const day = (page: Page, iso: string) =>
	page.locator(`[data-testid="calendar-day"][data-day="${iso}"]`);
const item = (page: Page, title: string) =>
	page.getByTestId('calendar-item').filter({ hasText: title });

test('a planner reschedules follow-ups on the week calendar by dragging and by picking a day', async ({
	page
}) => {
	await signIn(page, 'planner');
	const pulled = await (await page.request.get('/api/sync/pull?since=0')).json();
	const asset = pulled.assets.find((a: { tag: string }) => a.tag === TAG);
	const today = new Date().toISOString().slice(0, 10);
	const next = addDays(mondayOf(today), 7);
	const stamp = Date.now().toString(36);
	const dated = `Shim the cooling-tower fan motor ${stamp}`;
	const undated = `Check the fan deck bolts ${stamp}`;
	await create(page, asset.id, dated, next);
	await create(page, asset.id, undated, '');

	await page.getByRole('link', { name: 'Week calendar' }).click();
	await expect(page.getByTestId('week-calendar')).toBeVisible();
	// seven days as columns, Monday first, today marked
	await expect(page.getByTestId('calendar-day')).toHaveCount(7);
	await expect(page.getByTestId('calendar-day').first()).toHaveAttribute(
		'data-day',
		mondayOf(today)
	);
	await expect(day(page, today)).toContainText('today');
	// the one without a date waits to be placed, whatever the week
	await expect(page.getByTestId('calendar-waiting')).toContainText(undated);

	// last week's days take nothing: picked, no day offers "Move here"; dropped, nothing changes
	await page.getByRole('link', { name: 'Previous week' }).click();
	await expect(page).toHaveURL(new RegExp(`week=${addDays(mondayOf(today), -7)}`));
	await item(page, undated).getByRole('button', { name: 'Move' }).click();
	await expect(page.getByRole('button', { name: 'Move here' })).toHaveCount(0);
	await page.keyboard.press('Escape');
	await expect(item(page, undated).getByRole('button', { name: 'Move' })).toHaveAttribute(
		'aria-pressed',
		'false'
	);
	await item(page, undated).dragTo(day(page, addDays(mondayOf(today), -5)));
	await expect(page.getByTestId('reschedule-done')).toHaveCount(0);
	await expect(page.getByTestId('calendar-waiting')).toContainText(undated);
	await page.getByRole('link', { name: 'This week' }).click();

	await page.getByRole('link', { name: 'Next week' }).click();
	await expect(page).toHaveURL(new RegExp(`week=${next}`));
	await expect(day(page, next)).toContainText(dated);

	// drag: Monday → Wednesday of next week
	const wednesday = addDays(next, 2);
	await item(page, dated).dragTo(day(page, wednesday));
	await expect(page.getByTestId('reschedule-done')).toContainText(`${TAG} “${dated}” is now due`);
	await expect(day(page, wednesday)).toContainText(dated);
	await expect(day(page, next)).not.toContainText(dated);

	// pick, for a finger or the keyboard: Move, then Move here on Friday
	const friday = addDays(next, 4);
	await item(page, dated).getByRole('button', { name: 'Move' }).click();
	await expect(page.getByRole('status').filter({ hasText: `Moving ${TAG}` })).toBeVisible();
	await page.getByRole('button', { name: `Move ${TAG} to Fri` }).click();
	await expect(day(page, friday)).toContainText(dated);

	// the undated one dragged onto Tuesday gets its date and is scheduled
	const tuesday = addDays(next, 1);
	await item(page, undated).dragTo(day(page, tuesday));
	await expect(
		day(page, tuesday).getByTestId('calendar-item').filter({ hasText: undated })
	).toHaveAttribute('data-status', 'scheduled');

	// the server kept both: a fresh load shows them where they were put
	await page.reload();
	await expect(day(page, friday)).toContainText(dated);
	await expect(day(page, tuesday)).toContainText(undated);

	// a past date sent straight to the server is refused with the reason, and nothing moves
	await page.goto('/follow-ups');
	const listed = page.getByTestId('follow-up').filter({ hasText: dated });
	const followUpId = await listed.locator('input[name="id"]').first().getAttribute('value');
	const refused = await page.request.post('/follow-ups?/reschedule', {
		form: { id: followUpId!, dueDate: '2020-01-01' },
		headers: { origin: ORIGIN, 'x-sveltekit-action': 'true' }
	});
	const answer = await refused.json();
	expect(answer).toMatchObject({ type: 'failure', status: 400 });
	expect(JSON.stringify(answer.data)).toContain('has passed');
	await page.goto(`/follow-ups?view=week&week=${friday}`);
	await expect(day(page, friday)).toContainText(dated);
});
