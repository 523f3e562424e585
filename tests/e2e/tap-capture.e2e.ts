/**
 * Tap capture end to end, on Debian's chromium with its fake capture device playing a WAV this
 * test writes: four strikes on a two-mode structure (each mode the ODEX-integrated damped
 * oscillator of tests/support/tap-signal.ts, with the plant's noise), the second a double hit.
 * The technician opens Floor check online once, walks out of coverage (the network off before
 * Start), adds a sensor, records, sees the double hit left out and three hits averaged, takes the
 * modes found, saves and, back in coverage, syncs; the server keeps the WAV and re-analyses it.
 */
import { WaveFile } from '../../src/lib/recordings/wavefile.ts';
import { test, expect } from './fixtures.ts';
import { openFieldOnline, pickAsset, syncAll } from './floor.ts';
import { CHROMIUM, CHROMIUM_ARGS, fakeAudioInputArgs } from '../support/chromium.ts';
import { writeTapWav } from '../support/tap-signal.ts';

// the fake device plays at 44.1 kHz: the file is written at that rate, so nothing is resampled
const FS = 44100;
const TRUTH = [
	{ f: 37, zeta: 0.02, gain: 1 },
	{ f: 83, zeta: 0.015, gain: 1.5 }
];
const wavPath = writeTapWav({
	fs: FS,
	seconds: 14,
	modes: TRUTH,
	// 1.5 s of background first (the noise floor is learnt), then a strike every 3 s; the
	// second is struck twice, 150 ms apart
	hits: [
		{ at: 1.5, force: 1 },
		{ at: 4.5, force: 0.8 },
		{ at: 4.65, force: 0.7 },
		{ at: 7.5, force: 1.1 },
		{ at: 10.5, force: 0.9 }
	],
	peak: 0.45,
	noise: 0.003,
	ringS: 2.9
});

test.use({
	launchOptions: {
		executablePath: CHROMIUM,
		args: [...CHROMIUM_ARGS, ...fakeAudioInputArgs(wavPath, false)]
	}
});

test('a technician records three hits offline with the tablet, the double hit left out, and the modes and the WAV reach the server', async ({
	page,
	context
}) => {
	test.setTimeout(180_000);
	await openFieldOnline(page);
	await pickAsset(page, 'KRW-RWP-102');
	await page.getByLabel(/^Measured running speed/).fill('1000');
	await context.setOffline(true);

	await page.getByRole('tab', { name: 'Record a bump test here' }).click();
	const tap = page.getByTestId('tap-capture');
	await expect(tap.getByTestId('capture-cautions')).toContainText('locked out and tagged out');
	await expect(tap.getByTestId('no-sensors')).toBeVisible();
	await tap.getByRole('button', { name: 'Add a sensor' }).click();
	await tap.getByLabel('Name').fill('A-113');
	await tap.getByLabel(/^Sensitivity/).fill('100');
	await tap.getByLabel(/^Full-scale input/).fill('2');
	await tap.getByRole('button', { name: 'Save the sensor' }).click();
	await expect(tap.getByLabel('Sensor')).toContainText('A-113 — 100 mV/g into ±2 V');
	await tap.getByLabel('Record length per hit').selectOption('2');

	// nothing is open until Start
	await expect(tap.getByTestId('input-open')).toHaveCount(0);
	await tap.getByRole('button', { name: 'Start' }).click();
	await expect(tap.getByTestId('input-open')).toContainText('Input open');
	await expect(tap.getByTestId('capture-state')).toHaveAttribute('data-state', 'armed', {
		timeout: 10_000
	});

	const hits = tap.getByTestId('hit');
	await expect(hits).toHaveCount(4, { timeout: 30_000 });
	await expect(hits.nth(1)).toHaveAttribute('data-kept', 'false');
	await expect(hits.nth(1)).toContainText('double hit');
	for (const i of [0, 2, 3]) await expect(hits.nth(i)).toHaveAttribute('data-kept', 'true');

	// the result: the same analysis as a loaded file, of the three kept hits averaged
	const loader = page.getByTestId('recording-loader');
	await expect(loader.getByTestId('recording-note')).toContainText(
		'Tap capture: 3 hits averaged (1 double hit); A-113, 100 mV/g into ±2 V',
		{ timeout: 20_000 }
	);
	await tap.getByRole('button', { name: 'Stop' }).click();
	await expect(tap.getByTestId('input-open')).toHaveCount(0);

	const rows = await loader.getByTestId('peaks').getByRole('listitem').allInnerTexts();
	const found = rows.map((r) => ({
		f: Number(/([\d.]+) Hz/.exec(r)?.[1]),
		zeta: Number(/ζ ([\d.]+)/.exec(r)?.[1])
	}));
	for (const m of TRUTH) {
		const got = found.find((q) => Math.abs(q.f - m.f) / m.f < 0.005);
		expect(got, `${m.f} Hz among ${JSON.stringify(found)}`).toBeDefined();
		expect(Math.abs(got!.zeta - m.zeta) / m.zeta).toBeLessThan(0.2);
	}
	// keep only the two true modes, as a technician would
	const boxes = loader.getByTestId('peaks').getByRole('checkbox');
	for (let i = 0; i < found.length; i++)
		if (!TRUTH.some((m) => Math.abs(found[i].f - m.f) / m.f < 0.005)) await boxes.nth(i).uncheck();
	await loader.getByRole('button', { name: /^Use 2 frequencies/ }).click();
	await page.getByRole('button', { name: 'Save check' }).click();
	await expect(page.getByTestId('saved-message')).toContainText('KRW-RWP-102');

	// back in coverage at the end of the shift
	await context.setOffline(false);
	await syncAll(page);
	const pulled = await (await page.request.get('/api/sync/pull?since=0')).json();
	const asset = pulled.assets.find((a: { tag: string }) => a.tag === 'KRW-RWP-102');
	await page.goto(`/assets/${asset.id}`);
	const history = page.getByTestId('history-modes').first();
	await expect(history).toContainText(/3[67]\.\d\d Hz \(recording\)/);
	await expect(history).toContainText(/8[23]\.\d\d Hz \(recording\)/);
	const recordings = page.getByTestId('recordings');
	await expect(recordings).toContainText(/tap-KRW-RWP-102-\d{8}-\d{4}\.wav/);
	const href = await recordings
		.getByRole('link', { name: 'Download' })
		.first()
		.getAttribute('href');
	const wav = new WaveFile(await (await page.request.get(href!)).body());
	const meta = JSON.parse(wav.getTag('ICMT') as string);
	expect(meta.sensor).toEqual({
		name: 'A-113',
		kind: 'accelerometer',
		sensitivity: { mode: 'mV', mvPerUnit: 100, fullScaleV: 2 }
	});
	expect(meta.rejected).toEqual({ 'double-hit': 1 });
	expect(meta.recordSamples).toBe(2 * FS);
	const samples = wav.getSamples(false, Float64Array) as unknown as Float64Array;
	expect(samples.length).toBe(3 * 2 * FS);
	// each kept hit opens with 5 % of pre-trigger noise and then rings at the 0.45 peak's scale
	// (16-bit fake device: the samples are the file's within its quantisation)
	for (let k = 0; k < 3; k++) {
		const hit = samples.subarray(k * 2 * FS, (k + 1) * 2 * FS);
		const pre = Math.round(0.05 * 2 * FS);
		let before = 0;
		let after = 0;
		for (let i = 0; i < pre - 10; i++) before = Math.max(before, Math.abs(hit[i]));
		for (let i = pre; i < hit.length; i++) after = Math.max(after, Math.abs(hit[i]));
		expect(before).toBeLessThan(0.01);
		expect(after).toBeGreaterThan(0.2);
	}
});

/**
 * The test watches, without changing anything, every stream the page opens: getUserMedia wrapped
 * to keep its streams, and the tracks' states written to sessionStorage when the page goes away.
 */
async function watchStreams(page: import('@playwright/test').Page) {
	await page.addInitScript(() => {
		const w = window as unknown as { __streams: MediaStream[] };
		w.__streams = [];
		const md = navigator.mediaDevices;
		const original = md.getUserMedia.bind(md);
		md.getUserMedia = async (c) => {
			const s = await original(c);
			w.__streams.push(s);
			return s;
		};
		addEventListener('pagehide', () =>
			sessionStorage.setItem(
				'tracks-at-exit',
				JSON.stringify(w.__streams.flatMap((s) => s.getTracks().map((t) => t.readyState)))
			)
		);
	});
}
const liveTracks = (page: import('@playwright/test').Page) =>
	page.evaluate(() =>
		(window as unknown as { __streams: MediaStream[] }).__streams.flatMap((s) =>
			s.getTracks().map((t) => t.readyState)
		)
	);

test('the input closes when the technician leaves the capture screen and when they sign out', async ({
	page
}) => {
	await watchStreams(page);
	await openFieldOnline(page);
	await pickAsset(page, 'KRW-RWP-102');
	await page.getByRole('tab', { name: 'Record a bump test here' }).click();
	const tap = page.getByTestId('tap-capture');
	// each test is a new browser context, a tablet without sensors
	await tap.getByRole('button', { name: 'Add a sensor' }).click();
	await tap.getByLabel('Name').fill('Mic on the tablet');
	await tap.getByLabel('Kind').selectOption('microphone');
	await tap.getByRole('button', { name: 'Save the sensor' }).click();
	await tap.getByRole('button', { name: 'Start' }).click();
	await expect(tap.getByTestId('input-open')).toBeVisible();
	expect(await liveTracks(page)).toEqual(['live']);

	// leaving the screen: another way of adding frequencies
	await page.getByRole('tab', { name: 'Type frequencies' }).click();
	await expect.poll(() => liveTracks(page)).toEqual(['ended']);

	// back, Start again, then sign out with the input open
	await page.getByRole('tab', { name: 'Record a bump test here' }).click();
	await tap.getByRole('button', { name: 'Start' }).click();
	await expect(tap.getByTestId('input-open')).toBeVisible();
	expect(await liveTracks(page)).toEqual(['ended', 'live']);
	await page.getByRole('button', { name: 'Sign out' }).first().click();
	await page.waitForURL(/\/login/);
	expect(await page.evaluate(() => sessionStorage.getItem('tracks-at-exit'))).toBe(
		JSON.stringify(['ended', 'ended'])
	);
});
