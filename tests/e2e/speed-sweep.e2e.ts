/**
 * Speed sweep end to end: a run-up of backwash pump 2 (on a drive, 1200–1780 rpm) recorded with a
 * once-per-revolution tachometer, its structure an SDOF with unbalance forcing integrated by ODEX
 * (tests/support/sweep-signal.ts): 25 Hz, ζ 0.04, so the steady peak is at 1500/√(1 − 2·0.04²) =
 * 1502.4 rpm and AF ≈ 1/(2ζ) = 12.5 (textbook, [S]). The technician opens Floor check online once,
 * walks out of coverage, loads the file, takes the resonance found, sees the avoidance band over
 * its speed and saves; back in coverage the check and the file reach the server, which analyses
 * the file again with the same channel roles.
 */
import { test, expect } from './fixtures.ts';
import { openFieldOnline, pickAsset, syncAll } from './floor.ts';
import { ramp, sweepCsv, sweepRecord } from '../support/sweep-signal.ts';

const csv = sweepCsv(
	sweepRecord({
		fs: 1024,
		// 1150 → 1800 rpm in 60 s: η = (df/dt)/Δf² ≈ 0.045, slow enough (see sweep.spec.ts)
		speed: ramp(1150, 1800, 60),
		modes: [{ f: 25, zeta: 0.04, unbalanceUm: 8 }],
		noiseUm: 1,
		markDeg: 60
	})
);

test('a technician loads a run-up offline, takes its resonance and saves a check whose avoidance band holds that speed', async ({
	page,
	context
}) => {
	test.setTimeout(120_000);
	await openFieldOnline(page);
	await pickAsset(page, 'KRW-BWP-302');
	await page.getByLabel(/^Measured running speed/).fill('1450');
	await context.setOffline(true);

	await page.getByRole('tab', { name: 'Speed sweep (run-up or coast-down)' }).click();
	const sweep = page.getByTestId('speed-sweep');
	await expect(sweep.getByRole('note')).toContainText('locked out');
	await sweep.getByLabel(/Recording with a tachometer/).setInputFiles({
		name: 'bwp-302-runup.csv',
		mimeType: 'text/csv',
		buffer: Buffer.from(csv)
	});
	// the roles the file suggests: the tachometer by its name, 1×, 2× and the 7-vane pass
	await expect(sweep.getByLabel('Tachometer channel')).toHaveValue('0', { timeout: 30_000 });
	await expect(sweep.getByLabel('Vibration')).toHaveValue('1');
	await expect(sweep.getByLabel(/^Orders to track/)).toHaveValue('1, 2, 7');
	await expect(sweep.getByTestId('sweep-summary')).toContainText('none repaired');
	await expect(sweep.getByTestId('sweep-summary')).toContainText('run-up');
	await expect(sweep.getByTestId('bode')).toBeVisible();
	await expect(sweep.getByTestId('polar')).toBeVisible();
	await expect(sweep.getByTestId('waterfall')).toBeVisible();

	const found = sweep.getByTestId('resonances').getByRole('listitem');
	await expect(found).toHaveCount(1);
	const text = await found.first().innerText();
	const rpm = Number(/1× run-up: (\d+) rpm/.exec(text)?.[1]);
	const af = Number(/AF ([\d.]+)/.exec(text)?.[1]);
	// within 0.6 % of the steady peak (the sweep moves it up a little) and 10 % of 1/(2ζ)
	expect(Math.abs(rpm / 1502.4 - 1)).toBeLessThan(0.006);
	expect(Math.abs(af / 12.5 - 1)).toBeLessThan(0.1);
	await expect(found.first()).toContainText('API 684 margin for this AF');
	await expect(found.first().getByRole('checkbox')).toBeChecked();

	// the Bode plot reads out a speed under the finger
	const bode = sweep.getByTestId('bode');
	const box = (await bode.boundingBox())!;
	await bode.click({ position: { x: box.width / 2, y: box.height / 3 } });
	await expect(sweep.getByTestId('bode-readout')).toContainText(
		/run-up 1 \(115\d → 1[78]\d\d rpm, 60 s\): \d+ rpm, [\d.]+\s+µm, \d+°/
	);

	await sweep.getByRole('button', { name: 'Use 1 resonance as natural frequencies' }).click();
	await expect(page.getByTestId('modes-list')).toContainText('(run-up)');
	// the avoidance band the check asks for holds the resonance's speed
	const bands = page.getByTestId('bands').locator('tbody tr');
	const rows = await bands.allInnerTexts();
	const holds = rows.some((r) => {
		const m = /(\d+)–(\d+)/.exec(r);
		return m !== null && Number(m[1]) <= rpm && rpm <= Number(m[2]);
	});
	expect(holds, `a band over ${rpm} rpm among ${JSON.stringify(rows)}`).toBe(true);
	await page.getByRole('button', { name: 'Save check' }).click();
	await expect(page.getByTestId('saved-message')).toContainText('KRW-BWP-302');

	// back in coverage: the check, its mode and the file reach the server
	await context.setOffline(false);
	await syncAll(page);
	const pulled = await (await page.request.get('/api/sync/pull?since=0')).json();
	const asset = pulled.assets.find((a: { tag: string }) => a.tag === 'KRW-BWP-302');
	expect(asset.lastCheck.modes).toHaveLength(1);
	expect(Math.abs((asset.lastCheck.modes[0].frequencyHz * 60) / rpm - 1)).toBeLessThan(0.002);
	await page.goto(`/assets/${asset.id}`);
	await expect(page.getByTestId('history-modes').first()).toContainText(
		/\(run-up, AF 1[1-4]\.\d\)/
	);
	const stored = page.getByTestId('recordings');
	await expect(stored).toContainText('bwp-302-runup.csv');
	await expect(stored).toContainText('speed sweep, 1 resonance found on the server');
	await expect(stored).not.toContainText('server analysis differs');
});
