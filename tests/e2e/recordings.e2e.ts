import { type Page } from '@playwright/test';
import { readUff } from '../../src/lib/recordings/uff.ts';
import { frfUff } from '../support/frf-uff.ts';
import { expect, test } from './fixtures.ts';
import { syncAll } from './floor.ts';
import wavefile from 'wavefile';

const { WaveFile } = wavefile;
import { signIn } from './helpers.ts';

/** A bump-test ring-down made from the closed-form free decay of two modes (Rao §2.6). */
function ringdown(
	fs: number,
	seconds: number,
	modes: { f: number; zeta: number; a: number }[]
): number[] {
	return Array.from({ length: Math.round(fs * seconds) }, (_, i) => {
		const t = i / fs;
		return modes.reduce(
			(v, m) =>
				v +
				m.a *
					Math.exp(-m.zeta * 2 * Math.PI * m.f * t) *
					Math.sin(2 * Math.PI * m.f * Math.sqrt(1 - m.zeta ** 2) * t),
			0
		);
	});
}

/** A technician signs in, opens Floor check and picks the asset by its tag. */
async function openOnFloor(page: Page, tag: string) {
	await signIn(page, 'technician');
	await page.goto('/field');
	await page.getByLabel('Search by tag or name').fill(tag);
	await page
		.getByTestId('asset-list')
		.getByRole('button', { name: new RegExp(tag) })
		.click();
}

/** Saves the check, syncs it and opens the asset's sheet, as the technician then the reader would. */
async function saveSyncAndOpenSheet(page: Page, tag: string) {
	await page.getByRole('button', { name: 'Save check' }).click();
	await syncAll(page);
	const pulled = await (await page.request.get('/api/sync/pull?since=0')).json();
	const asset = pulled.assets.find((a: { tag: string }) => a.tag === tag);
	await page.goto(`/assets/${asset.id}`);
}

function wavBuffer(): Buffer {
	const x = ringdown(2048, 6, [
		{ f: 23, zeta: 0.02, a: 0.5 },
		{ f: 71, zeta: 0.015, a: 0.3 }
	]);
	const w = new WaveFile();
	w.fromScratch(
		1,
		2048,
		'16',
		x.map((v) => Math.round(v * 32767))
	);
	return Buffer.from(w.toBuffer());
}

function csvBuffer(): Buffer {
	const fs = 1024;
	const x = ringdown(fs, 5, [{ f: 31, zeta: 0.025, a: 1.2 }]);
	return Buffer.from(
		`time,accel\ns,g\n${x.map((v, i) => `${(i / fs).toFixed(6)},${v.toFixed(6)}`).join('\n')}\n`
	);
}

test('a technician loads a WAV and a CSV on Floor check, drops a peak, saves, syncs, and finds the modes and the files on the asset sheet', async ({
	page
}) => {
	await openOnFloor(page, 'KRW-RWP-102');
	await page.getByLabel(/^Measured running speed/).fill('1000');
	await page.getByRole('tab', { name: 'Bump-test file' }).click();

	const wav = wavBuffer();
	await page
		.getByLabel(/CSV or WAV file/)
		.setInputFiles({ name: 'rwp102-hit.wav', mimeType: 'audio/wav', buffer: wav });
	const peaks = page.getByTestId('peaks');
	await expect(peaks).toContainText(/22\.9\d Hz|23\.0\d Hz/);
	await expect(peaks).toContainText(/70\.9\d Hz|71\.0\d Hz/);
	// drop the 71 Hz peak
	await peaks.getByRole('checkbox', { name: /Keep 7[01]\.\d\d Hz/ }).uncheck();
	await page.getByLabel('Location').last().fill('Motor top');
	await page.getByRole('button', { name: /^Use 1 frequency$/ }).click();
	await expect(page.getByTestId('modes-list')).toContainText(/2[23]\.\d\d Hz/);
	await expect(page.getByTestId('modes-list')).not.toContainText(/7[01]\.\d\d Hz/);

	const csv = csvBuffer();
	await page
		.getByLabel(/CSV or WAV file/)
		.setInputFiles({ name: 'rwp102-base.csv', mimeType: 'text/csv', buffer: csv });
	await expect(page.getByTestId('peaks')).toContainText(/3[01]\.\d\d Hz/);
	await page.getByRole('button', { name: /^Use 1 frequency$/ }).click();
	await expect(page.getByTestId('modes-list')).toContainText(/3[01]\.\d\d Hz/);

	await saveSyncAndOpenSheet(page, 'KRW-RWP-102');
	await expect(page.getByTestId('history-modes').first()).toContainText(
		/2[23]\.\d\d Hz \(recording\)/
	);
	await expect(page.getByTestId('history-modes').first()).toContainText(
		/3[01]\.\d\d Hz \(recording\)/
	);
	const recordings = page.getByTestId('recordings');
	await expect(recordings).toContainText('rwp102-hit.wav');
	await expect(recordings).toContainText('rwp102-base.csv');
	const links = recordings.getByRole('link', { name: 'Download' });
	const hrefs = await links.evaluateAll((as) =>
		as.map((a) => (a as HTMLAnchorElement).getAttribute('href'))
	);
	const bodies = await Promise.all(hrefs.map(async (h) => (await page.request.get(h!)).body()));
	expect(bodies.some((b) => b.equals(wav))).toBe(true);
	expect(bodies.some((b) => b.equals(csv))).toBe(true);
	const res = await page.request.get(hrefs[0]!);
	expect(res.headers()['content-disposition']).toMatch(/^attachment/);
	expect(res.headers()['content-type']).toMatch(/^(text\/csv|audio\/wav)/); // never a type a browser would run
	expect(res.headers()['x-content-type-options']).toBe('nosniff');
});

test('a bad file gets its own message on Floor check and nothing is added', async ({ page }) => {
	await openOnFloor(page, 'KRW-RWP-104');
	await page.getByRole('tab', { name: 'Bump-test file' }).click();
	const bad = Buffer.from('time,accel\n0,0.1\n0.001,abc\n'.padEnd(400, '\n'));
	await page
		.getByLabel(/CSV or WAV file/)
		.setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: bad });
	await expect(page.getByTestId('recording-error')).toHaveText(
		'Row 3, column 2 (“accel”): expected a number, found “abc”.'
	);
	await expect(
		page.getByText('None yet: type one, estimate one, or load a bump-test recording.')
	).toBeVisible();
});

test('a sample rate typed for one CSV is not applied to the next, which has its own time column', async ({
	page
}) => {
	await openOnFloor(page, 'KRW-RWP-104');
	await page.getByRole('tab', { name: 'Bump-test file' }).click();
	// a single column of samples needs the rate
	const x = ringdown(2048, 4, [{ f: 37, zeta: 0.02, a: 1 }]);
	await page.getByLabel(/CSV or WAV file/).setInputFiles({
		name: 'samples.csv',
		mimeType: 'text/csv',
		buffer: Buffer.from(x.map((v) => v.toFixed(6)).join('\n'))
	});
	await expect(page.getByTestId('recording-error')).toHaveText(
		'This file has no time column: give the sample rate in Hz.'
	);
	await page.getByLabel(/Sample rate/).fill('2048');
	await page.getByLabel(/Sample rate/).press('Tab');
	await expect(page.getByTestId('recording-loader')).toContainText(
		'samples.csv: 1 channel, 2048 Hz'
	);
	// the next file has an unnamed time column at 4,096 Hz: before, the stale 2048 made that column
	// a second signal (a ramp), without a word
	const fs = 4096;
	const y = ringdown(fs, 3, [{ f: 52, zeta: 0.02, a: 1 }]);
	await page.getByLabel(/CSV or WAV file/).setInputFiles({
		name: 'timed.csv',
		mimeType: 'text/csv',
		buffer: Buffer.from(y.map((v, i) => `${(i / fs).toFixed(9)},${v.toFixed(6)}`).join('\n'))
	});
	await expect(page.getByTestId('recording-loader')).toContainText('timed.csv: 1 channel, 4096 Hz');
	await expect(page.getByLabel(/Sample rate/)).toHaveValue('');
	await expect(page.getByTestId('peaks')).toContainText('52.0');

	// the frequency axis opens on the modes, with a way out to the whole spectrum
	await expect(page.getByRole('button', { name: 'Show the whole spectrum' })).toBeVisible();
	// a tap on the spectrum picks a frequency and adds nothing until the person says so
	const before = await page.getByTestId('peaks').locator('li').count();
	const over = page.locator('[data-testid="recording-loader"] .u-over').last();
	const box = (await over.boundingBox())!;
	await over.click({ position: { x: box.width * 0.3, y: box.height / 2 } });
	await expect(page.getByTestId('pending-peak')).toBeVisible();
	await expect(page.getByTestId('peaks').locator('li')).toHaveCount(before);
	await page.getByRole('button', { name: /^Add a peak at / }).click();
	await expect(page.getByTestId('peaks').locator('li')).toHaveCount(before + 1);
	await expect(page.getByTestId('peaks')).toContainText('added by hand');
	await page.getByRole('button', { name: 'Show the whole spectrum' }).click();
	await expect(page.getByRole('button', { name: 'Zoom to the modes' })).toBeVisible();
});

test('a technician subtracts a background record of the running machine from a bump test', async ({
	page
}) => {
	await openOnFloor(page, 'KRW-RWP-104');
	await page.getByLabel(/^Measured running speed/).fill('1000');
	await page.getByRole('tab', { name: 'Bump-test file' }).click();
	// 12 s of the machine running without hits, at the bump test's 2,048 Hz
	let seed = 5;
	const hum = Array.from({ length: 2048 * 12 }, (_, i) => {
		seed = (seed * 16807) % 2147483647;
		return Math.round(300 * Math.sin((2 * Math.PI * 140 * i) / 2048) * (seed / 2147483647));
	});
	const w = new WaveFile();
	w.fromScratch(1, 2048, '16', hum);
	await page.getByLabel(/^Background/).setInputFiles({
		name: 'running.wav',
		mimeType: 'audio/wav',
		buffer: Buffer.from(w.toBuffer())
	});
	await page
		.getByLabel(/CSV or WAV file/)
		.setInputFiles({ name: 'hit.wav', mimeType: 'audio/wav', buffer: wavBuffer() });
	await expect(page.getByTestId('recording-loader')).toContainText(
		'the background (running.wav) averaged over 2 stretches and subtracted'
	);
	await expect(page.getByTestId('peaks')).toContainText('23.0');
	// a WAV in raw counts gives no overall level, and says why
	await expect(page.getByTestId('background-level')).toContainText('not a calibrated acceleration');
	// saved and synced, the background travels with the check and the server analyses the bump
	// test with it, as the tablet did
	await page.getByRole('button', { name: /^Use \d frequenc/ }).click();
	await page.getByRole('button', { name: 'Save check' }).click();
	await syncAll(page);
	const pulled = await (await page.request.get('/api/sync/pull?since=0')).json();
	const asset = pulled.assets.find((a: { tag: string }) => a.tag === 'KRW-RWP-104');
	await page.goto(`/assets/${asset.id}`);
	const recordings = page.getByTestId('recordings');
	await expect(recordings).toContainText('running.wav');
	await expect(recordings.locator('li').filter({ hasText: 'running.wav' })).toContainText(
		'background of the running machine'
	);
	await expect(recordings).toContainText('hit.wav');
	await expect(recordings).not.toContainText('server analysis differs');
	// the check's recordings leave as UFF dataset 58: one time record per channel, read back
	const href = await page.getByTestId('uff-export').first().getAttribute('href');
	const uff = await page.request.get(href!);
	expect(uff.headers()['content-disposition']).toContain('.uff');
	const datasets = readUff(new Uint8Array(await uff.body()));
	expect(datasets.map((d) => d.idLines[0])).toEqual(
		expect.arrayContaining([
			expect.stringContaining('running.wav'),
			expect.stringContaining('hit.wav')
		])
	);
	expect(datasets.every((d) => Math.round(1 / d.dx) === 2048)).toBe(true);
});

test('a calibrated background record gives the overall level, which the technician takes for the check', async ({
	page
}) => {
	await openOnFloor(page, 'KRW-RWP-104');
	await page.getByLabel(/^Measured running speed/).fill('1000');
	await page.getByRole('tab', { name: 'Bump-test file' }).click();
	// 8 s of the machine running: 0.2 g at 40 Hz, which is 0.2 · 9.80665 / (2π · 40) / √2 m/s =
	// 5.52 mm/s r.m.s. (v = a / 2πf)
	const rows = Array.from({ length: 2048 * 8 }, (_, i) => {
		const t = i / 2048;
		return `${t.toFixed(6)},${(0.2 * Math.sin(2 * Math.PI * 40 * t)).toFixed(6)}`;
	});
	await page.getByLabel(/^Background/).setInputFiles({
		name: 'running.csv',
		mimeType: 'text/csv',
		buffer: Buffer.from(['time,acceleration', 's,g', ...rows].join('\n'))
	});
	await page
		.getByLabel(/CSV or WAV file/)
		.setInputFiles({ name: 'hit.wav', mimeType: 'audio/wav', buffer: wavBuffer() });
	const level = page.getByTestId('background-level');
	await expect(level).toContainText('5.52 mm/s r.m.s.');
	// at 2,048 samples/s the band is cut below 1,000 Hz, and the screen says so
	await expect(level).toContainText('10–922 Hz, integrated from acceleration');
	await expect(level).toContainText('reaches only 922 Hz of the 1000 Hz band');
	await level.getByRole('button', { name: 'Use 5.52 mm/s as the overall level' }).click();
	await expect(page.getByLabel(/^Overall vibration/)).toHaveValue('5.52');
	await expect(page.getByTestId('severity').locator('[data-zone]')).toHaveAttribute(
		'data-zone',
		/[A-D]/
	);
});

// an FRF from lab modal software (UFF dataset 58, complex accelerance of two modes from the
// handbook formula, tests/support/frf-uff.ts) goes through the same analysis as a recorded hit
test('a technician loads an FRF file from modal software on Floor check and takes its modes into the check', async ({
	page
}) => {
	await openOnFloor(page, 'KRW-RWP-102');
	await page.getByLabel(/^Measured running speed/).fill('1000');
	await page.getByRole('tab', { name: 'Bump-test file' }).click();
	const frf = Buffer.from(
		frfUff(
			[
				{ fn: 37.5, zeta: 0.02, m: 1 },
				{ fn: 52, zeta: 0.03, m: 1 }
			],
			'accelerance'
		)
	);
	await page
		.getByLabel(/CSV or WAV file/)
		.setInputFiles({ name: 'housing-frf.unv', mimeType: 'application/octet-stream', buffer: frf });
	await expect(page.getByTestId('recording-note')).toContainText(
		'Frequency response functions, analysed as their impulse responses'
	);
	const peaks = page.getByTestId('peaks');
	await expect(peaks).toContainText(/37\.[45]\d Hz/);
	await expect(peaks).toContainText(/5[12]\.\d\d Hz/);
	await page.getByRole('button', { name: /^Use 2 frequencies$/ }).click();
	await expect(page.getByTestId('modes-list')).toContainText(/37\.[45]\d Hz/);
	await saveSyncAndOpenSheet(page, 'KRW-RWP-102');
	await expect(page.getByTestId('history-modes').first()).toContainText(
		/37\.[45]\d Hz \(recording\)/
	);
	await expect(page.getByTestId('recordings')).toContainText('housing-frf.unv');
	// the check's UFF export gives the FRFs back as FRFs (function type 4), not as what they became
	const href = await page.getByTestId('uff-export').first().getAttribute('href');
	const exported = readUff(new Uint8Array(await (await page.request.get(href!)).body()));
	expect(exported.map((d) => d.functionType)).toEqual([4]);
	expect(exported[0].count).toBe(2049);
});
