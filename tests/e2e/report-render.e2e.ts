import { readFileSync } from 'node:fs';
import { expect, test } from './fixtures.ts';
import { ORIGIN, signInApi } from './helpers.ts';

// The check report as a reader sees it: every page drawn by PDF.js (pdfjs-dist, an independent
// PDF renderer) on a canvas in chromium, then looked at. The interference diagram's heading must
// sit on the page where the diagram itself is drawn, above it, never orphaned at a page's foot.
// The diagram is found by its pixels: the frame around the plot, a long unbroken dark line that no
// text or table draws.

const PDFJS = 'node_modules/pdfjs-dist/build';
const RENDER_PAGE = `${ORIGIN}/__test__/render-pdf`;

test('the check report, rendered page by page in chromium, keeps the diagram heading with its diagram', async ({
	page
}) => {
	// the report is served by the app; the renderer page is the test's own (no app CSP applies)
	await page.route(`${ORIGIN}/__test__/**`, (route) => {
		const url = new URL(route.request().url());
		if (url.pathname === '/__test__/render-pdf')
			return route.fulfill({ contentType: 'text/html', body: '<!doctype html><title>r</title>' });
		const file = url.pathname.replace('/__test__/', '');
		return route.fulfill({
			contentType: 'text/javascript',
			body: readFileSync(`${PDFJS}/${file}`, 'utf8')
		});
	});
	await signInApi(page.request, 'technician');
	const pulled = await (await page.request.get('/api/sync/pull?since=0')).json();
	const asset = pulled.assets.find((a: { tag: string }) => a.tag === 'KRW-HLP-203');
	const all = [
		14.2, 19.8, 24.5, 31.1, 38.6, 44.9, 52.3, 61.7, 70.4, 83.9, 97.2, 118.5, 133.0, 149.6
	].map((f, i) => ({
		frequencyHz: f,
		dampingRatio: 0.02 + 0.002 * i,
		direction: i % 2 ? 'vertical' : 'horizontal',
		location: i % 3 ? 'Motor top, outboard' : 'Pump casing, suction side',
		origin: 'typed'
	}));
	/** a check of the first n modes, sent as the tablet does; its report's bytes */
	async function reportOf(n: number) {
		const pushed = await page.request.post('/api/sync/push', {
			headers: { origin: ORIGIN },
			data: {
				clientId: 'report-render',
				items: [
					{
						id: crypto.randomUUID(),
						assetId: asset.id,
						checkedAt: Date.now(),
						measuredRpm: 1100,
						driveSetpointHz: null,
						notes: 'Base grout cracked at the outboard corner; shims under the motor feet.',
						replacesCheckId: null,
						modes: all.slice(0, n),
						device: {
							verdict: 'conflict',
							verdictAtSpeed: 'conflict',
							worstMarginAtSpeedPct: null,
							worstMarginOverRangePct: null
						}
					}
				]
			}
		});
		const result = (await pushed.json()).results[0];
		expect(result.status).toBe('applied');
		const pdf = await page.request.get(`/api/reports/checks/${result.id}`);
		expect(pdf.headers()['content-type']).toBe('application/pdf');
		return (await pdf.body()).toString('base64');
	}
	// one to fourteen modes: the tables grow a row at a time, so the diagram's heading comes at
	// every height of a page, the foot included, where it used to be left behind
	const reports = [];
	for (let n = 1; n <= all.length; n++) reports.push(await reportOf(n));

	await page.goto(RENDER_PAGE);
	await page.addScriptTag({
		type: 'module',
		content: "import * as lib from '/__test__/pdf.min.mjs'; window.pdfjsLib = lib;"
	});
	await page.waitForFunction(() => 'pdfjsLib' in window);
	const rendered = await page.evaluate(async (all) => {
		const each = [];
		for (const b64 of all) each.push(await renderOne(b64));
		return each;
		async function renderOne(b64: string) {
			// two pixels a point, so the frame's half-point line is a solid row; positions in points
			const SCALE = 2;
			const lib = (window as unknown as { pdfjsLib: typeof import('pdfjs-dist') }).pdfjsLib;
			lib.GlobalWorkerOptions.workerSrc = '/__test__/pdf.worker.min.mjs';
			const data = Uint8Array.from(atob(b64), (ch) => ch.charCodeAt(0));
			const doc = await lib.getDocument({ data, isEvalSupported: false }).promise;
			const out = [];
			for (let n = 1; n <= doc.numPages; n++) {
				const p = await doc.getPage(n);
				const viewport = p.getViewport({ scale: SCALE });
				const canvas = document.createElement('canvas');
				canvas.width = Math.ceil(viewport.width);
				canvas.height = Math.ceil(viewport.height);
				const ctx = canvas.getContext('2d')!;
				await p.render({ canvas, canvasContext: ctx, viewport }).promise;
				// the diagram's frame: rows crossed by one unbroken dark line over 55 % of the page's
				// width (its top and bottom edges). Text has gaps between letters and words; table
				// rules are light grey (#d6d9d2 in reports/pdf.ts)
				const px = ctx.getImageData(0, 0, canvas.width, canvas.height).data;
				const edges: number[] = [];
				for (let y = 0; y < canvas.height; y++) {
					let line = 0;
					let longest = 0;
					for (let x = 0; x < canvas.width; x++) {
						const i = 4 * (y * canvas.width + x);
						line = Math.max(px[i], px[i + 1], px[i + 2]) < 190 ? line + 1 : 0;
						longest = Math.max(longest, line);
					}
					if (longest >= 0.55 * canvas.width) edges.push(y / SCALE);
				}
				const rows = edges.length >= 2 ? [edges[0], edges[edges.length - 1]] : null;
				const text = await p.getTextContent();
				const heading = text.items.find(
					(t) => 'str' in t && t.str.includes('Interference diagram')
				) as { transform: number[] } | undefined;
				out.push({
					height: canvas.height / SCALE,
					// PDF y runs up from the foot of the page; the canvas's runs down from the top
					headingTop: heading ? viewport.height / SCALE - heading.transform[5] : null,
					frameTop: rows ? rows[0] : null,
					frameBottom: rows ? rows[1] : null,
					text: text.items.map((t) => ('str' in t ? t.str : '')).join(' ')
				});
			}
			return out;
		}
	}, reports);

	expect(rendered).toHaveLength(all.length);
	rendered.forEach((pages, r) => {
		const of = `report with ${r + 1} modes`;
		const withHeading = pages.flatMap((p, i) => (p.headingTop !== null ? [i] : []));
		const withDiagram = pages.flatMap((p, i) => (p.frameTop !== null ? [i] : []));
		expect(withHeading, of).toHaveLength(1);
		expect(withDiagram, of).toEqual(withHeading);
		const at = pages[withHeading[0]];
		// the heading just above the drawing (its labels between them), and the drawing a block
		expect(at.frameTop!, of).toBeGreaterThan(at.headingTop!);
		expect(at.frameTop! - at.headingTop!, of).toBeLessThan(40);
		expect(at.frameBottom! - at.frameTop!, of).toBeGreaterThan(200);
		expect(at.frameBottom!, of).toBeLessThan(at.height - 36);
		expect(at.text, of).toContain('shaft speed (rpm)');
		// and every page says which it is
		pages.forEach((p, i) => expect(p.text, of).toContain(`page ${i + 1} of ${pages.length}`));
	});
	// the lengths really moved the diagram: at least once onto a page of its own making
	expect(new Set(rendered.map((p) => p.length)).size).toBeGreaterThan(1);
});
