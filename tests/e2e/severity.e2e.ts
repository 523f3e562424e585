import { expect, test } from './fixtures.ts';
import { openFieldOnline, pickAsset, typeMode, syncAll } from './floor.ts';
import { signIn } from './helpers.ts';

// Zones from the shipped limit set (ISO 20816-3 Annex A as quoted, group 2): rigid 1.4/2.8/4.5,
// flexible 2.3/4.5/7.1 mm/s. KRW-HLP-201 is a group 2 pump at a fixed 1185 rpm (19.75 Hz).
test('a technician types an overall level on Floor check, sees its zone, syncs, and the supervisor finds it on the board', async ({
	page,
	browser
}) => {
	await openFieldOnline(page);
	await pickAsset(page, 'KRW-HLP-201');
	await page.getByLabel(/^Measured running speed/).fill('1185');
	const level = page.getByLabel(/^Overall vibration/);
	await level.fill('fast');
	// the field says what is wrong, and so does the reason Save is off
	await expect(level).toHaveAttribute('aria-invalid', 'true');
	await expect(page.getByTestId('save-reason')).toHaveText(
		'Overall velocity: a number of mm/s, or leave it empty.'
	);
	await level.fill('5.2');
	// no natural frequency yet: the stricter rigid limits, and the screen says it assumed them
	const zone = page.getByTestId('severity');
	await expect(zone.locator('[data-zone]')).toHaveAttribute('data-zone', 'D');
	await expect(zone).toContainText('assumed');
	// a 17 Hz mode is below 1.25 × 19.75 Hz: a flexible support, whose limits put 5.2 mm/s in C
	await typeMode(page, '17', '0.03');
	await expect(zone.locator('[data-zone]')).toHaveAttribute('data-zone', 'C');
	await expect(zone).toContainText('flexible support');
	await expect(zone).toContainText('10–1000 Hz');
	await expect(zone).toContainText('licensed copy of ISO 20816-3');
	await expect(page.getByTestId('bar-zone').locator('[data-zone]')).toHaveAttribute(
		'data-zone',
		'C'
	);
	await page.getByRole('button', { name: 'Save check' }).click();
	await expect(page.getByTestId('saved-message')).toContainText('KRW-HLP-201');
	await syncAll(page);

	const desk = await browser.newPage();
	await signIn(desk, 'supervisor');
	await desk.goto('/board?zone=C');
	const row = desk.getByTestId('board-row').filter({ hasText: 'KRW-HLP-201' });
	await expect(row.getByTestId('board-zone')).toContainText('zone C');
	await expect(row.getByTestId('board-zone')).toContainText('5.2 mm/s');
	// worst zone first when sorted by it
	await desk.goto('/board?sort=zone');
	const zones = await desk
		.getByTestId('board-zone')
		.locator('[data-zone]')
		.evaluateAll((els) => els.map((e) => e.getAttribute('data-zone')));
	const order = ['D', 'C', 'B', 'A', ''];
	expect(zones.map((z) => order.indexOf(z ?? ''))).toEqual(
		[...zones.map((z) => order.indexOf(z ?? ''))].sort((a, b) => a - b)
	);

	// the supervisor adjusts the group 2 flexible limits (after checking them against their copy):
	// a boundary out of order is refused with the reason; a good one zones the asset again
	await desk.goto('/severity-limits');
	await expect(desk.getByRole('note')).toContainText('licensed copy');
	const flexible = desk.getByTestId('limits-group2-flexible');
	await flexible.getByLabel('B/C').fill('2.0');
	await flexible.getByRole('button', { name: 'Save' }).click();
	await expect(flexible.getByText('The boundaries must rise: A/B < B/C < C/D.')).toBeVisible();
	await flexible.getByLabel('B/C').fill('5.5');
	await flexible.getByLabel('Source').fill('Site limits, confirmed against ISO 20816-3:2022');
	await flexible.getByRole('button', { name: 'Save' }).click();
	await expect(flexible.getByRole('status')).toContainText('zoned again');
	await desk.goto('/board?zone=B');
	await expect(
		desk.getByTestId('board-row').filter({ hasText: 'KRW-HLP-201' }).getByTestId('board-zone')
	).toContainText('zone B');
	// the change is in the audit trail, in words (admin)
	const admin = await browser.newPage();
	await signIn(admin, 'admin');
	await admin.goto('/admin/audit');
	await expect(admin.getByTestId('audit-entries').or(admin.locator('main'))).toContainText(
		'Zone B/C boundary (mm/s)'
	);
	await admin.close();
	await desk.close();
});
