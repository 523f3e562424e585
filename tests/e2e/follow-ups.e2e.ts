import { expect, test } from './fixtures.ts';
import { ORIGIN, signIn, signInApi } from './helpers.ts';

test('a planner turns a conflict check into a follow-up for a technician; the mail arrives; a clear retest closes it', async ({
	page,
	browser
}) => {
	await signIn(page, 'planner');
	const tech = await browser.newContext({ baseURL: ORIGIN });
	await signInApi(tech.request, 'technician');
	const pulled = await (await tech.request.get('/api/sync/pull?since=0')).json();
	const asset = pulled.assets.find((a: { tag: string }) => a.tag === 'KRW-RWP-101');
	// the technician's checks of that asset, as the tablet sends them
	const checkOf = (
		points: { direction: string; location: string }[],
		frequencies: number[],
		verdict: string
	) =>
		tech.request.post('/api/sync/push', {
			headers: { origin: ORIGIN },
			data: {
				clientId: 'retest',
				items: [
					{
						id: crypto.randomUUID(),
						assetId: asset.id,
						checkedAt: Date.now(),
						measuredRpm: 1000,
						driveSetpointHz: null,
						notes: 'Retest after the stiffener',
						replacesCheckId: null,
						modes: points.map((p, i) => ({
							frequencyHz: frequencies[i],
							dampingRatio: 0.02,
							...p,
							origin: 'typed'
						})),
						device: {
							verdict,
							verdictAtSpeed: verdict,
							worstMarginAtSpeedPct: null,
							worstMarginOverRangePct: null
						}
					}
				]
			}
		});
	const motor = { direction: 'horizontal', location: 'Motor top, in line with discharge' };
	const head = { direction: 'vertical', location: 'Discharge head' };
	const retest = (points: (typeof motor)[]) =>
		checkOf(
			points,
			points.map((_, i) => 300 + 40 * i),
			'clear'
		);
	// the bump test that found the problem: two modes, at the motor and at the discharge head (the
	// asset's latest check, whatever other tests sent before)
	const flagged = await checkOf([motor, head], [17.2, 48.5], 'conflict');
	expect((await flagged.json()).results[0]).toMatchObject({
		status: 'applied',
		verdict: 'conflict'
	});
	// the planner's queue lists it: in conflict, and no follow-up yet
	await page.goto('/follow-ups');
	const queued = page.getByTestId('planning-queue').locator('[data-tag="KRW-RWP-101"]');
	await expect(queued).toContainText('conflict');
	await page.goto(`/assets/${asset.id}`);
	await page.getByRole('link', { name: 'Create follow-up' }).first().click();
	const form = page.getByTestId('new-follow-up');
	await expect(form.getByTestId('suggested-remedy')).toBeVisible();
	await form.getByLabel('What is to be done').fill('Add a stiffener to the motor stand and retest');
	// only people of the asset's site are offered: Kettle River's technician, not Larkspur's
	const offered = await form.getByLabel('Assign to').locator('option').allTextContents();
	expect(offered).toContain('Tomas Ferreira (technician)');
	expect(offered).not.toContain('Ines Halvorsen (technician)');
	await form.getByLabel('Assign to').selectOption({ label: 'Tomas Ferreira (technician)' });
	await form.getByLabel('Due date').fill('2027-01-15');
	await form.getByRole('button', { name: 'Create follow-up' }).click();
	// the form closes, so a second tap cannot make a second one; the new one is marked in the list
	await expect(page.getByTestId('new-follow-up')).toHaveCount(0);
	const item = page.locator('[data-testid="follow-up"][data-created="true"]');
	await expect(item.getByRole('status')).toHaveText(
		'Follow-up created. The assignee has been e-mailed.'
	);
	await expect(item).toContainText('Add a stiffener');
	await expect(item).toHaveAttribute('data-tag', 'KRW-RWP-101');
	// and it has left the queue
	await expect(queued).toHaveCount(0);
	await expect(item.getByTestId('status')).toHaveText('scheduled');

	// the admin's mailbox holds the assignment, with the asset and the due date
	const admin = await browser.newContext();
	const ap = await admin.newPage();
	await signIn(ap, 'admin');
	await ap.goto('/admin/mailbox');
	const message = ap
		.getByTestId('message')
		.filter({ hasText: 'Assigned: KRW-RWP-101 — Add a stiffener to the motor stand and retest' });
	await expect(message).toContainText('to tech@example.com');
	await expect(message).toContainText('Due: 2027-01-15');
	await expect(message).toContainText('KRW-RWP-101');

	// the flagged check measured two points; a retest of one of them does not close it
	const res = await retest([motor]);
	expect((await res.json()).results[0]).toMatchObject({ status: 'applied', verdict: 'clear' });
	await page.reload();
	await expect(item.getByTestId('status')).toHaveText('scheduled');
	await expect(item).toContainText('did not measure vertical at Discharge head');
	const both = await retest([motor, head]);
	expect((await both.json()).results[0]).toMatchObject({ status: 'applied', verdict: 'clear' });
	await page.reload();
	await expect(item.getByTestId('status')).toHaveText('retested');
	// and the assignee and the planner who raised it are told
	await ap.goto('/admin/mailbox');
	const closed = ap.getByTestId('message').filter({
		hasText: 'Closed by a retest: KRW-RWP-101 — Add a stiffener to the motor stand and retest'
	});
	await expect(closed.filter({ hasText: 'to tech@example.com' })).toHaveCount(1);
	await expect(closed.filter({ hasText: 'to planner@example.com' })).toHaveCount(1);

	// the check report opens in chromium as a PDF
	const latest = await ap.request.get(`/api/reports/assets/${asset.id}`);
	expect(latest.headers()['content-type']).toBe('application/pdf');
	const pdfPage = await ap.context().newPage();
	const nav = await pdfPage.goto(`/api/reports/assets/${asset.id}`);
	expect(nav?.status()).toBe(200);
	expect(nav?.headers()['content-type']).toBe('application/pdf');
	await admin.close();
	await tech.close();
});

test('an overdue follow-up produces exactly one overdue mail however often the job runs', async ({
	page,
	browser
}) => {
	await signIn(page, 'planner');
	const pulled = await (await page.request.get('/api/sync/pull?since=0')).json();
	const asset = pulled.assets.find((a: { tag: string }) => a.tag === 'KRW-AB-401');
	await page.goto(`/follow-ups?new=${asset.id}`);
	const form = page.getByTestId('new-follow-up');
	await form.getByLabel('What is to be done').fill('Program the drive skip band for the blower');
	await form.getByLabel('Assign to').selectOption({ label: 'Tomas Ferreira (technician)' });
	await form.getByLabel('Due date').fill('2026-02-01');
	// a date in the past is refused, what was typed stays, and the form says how to file it anyway
	await form.getByRole('button', { name: 'Create follow-up' }).click();
	await expect(form.getByText(/Due date: 2026-02-01 has passed/)).toBeVisible();
	await expect(form.getByLabel('Due date')).toHaveValue('2026-02-01');
	await form.getByLabel('Back-dated record (the work was already due)').check();
	await form.getByRole('button', { name: 'Create follow-up' }).click();
	await expect(
		page
			.locator('[data-testid="follow-up"]')
			.filter({ hasText: 'Program the drive skip band for the blower' })
			.getByText('overdue')
	).toBeVisible();
	for (let i = 0; i < 3; i++) {
		await page.getByRole('button', { name: 'Send due reminders now' }).click();
		await expect(page.getByTestId('remind-done')).toBeVisible();
	}
	const admin = await browser.newContext();
	const ap = await admin.newPage();
	await signIn(ap, 'admin');
	await ap.goto('/admin/mailbox');
	await expect(
		ap
			.getByTestId('message')
			.filter({ hasText: 'Overdue: KRW-AB-401 — Program the drive skip band for the blower' })
	).toHaveCount(1);
	await admin.close();
});
