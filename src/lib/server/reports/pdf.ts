/**
 * PDF reports with pdfkit: one per check and one per asset — asset data, speed range, modes, the
 * margins table, verdict, avoidance bands, the interference diagram drawn as vectors, who and
 * when, who reviewed, and the cautions. Text stays text, so it can be searched and extracted.
 */
import type { SeverityOutcome } from '../../checks/severity.ts';
import { ZONE_MEANING } from '../../rules/severity-limits.ts';
import PDFDocument from 'pdfkit';
import { useInter } from './fonts.ts';
import { desc, eq } from 'drizzle-orm';
import { db } from '../db/index.ts';
import { checks, recordings, users } from '../db/schema.ts';
import type { StoredAnalysis } from '../analysis/task.ts';
import * as assetQueries from '../db/assets.ts';
import * as checkQueries from '../db/checks.ts';
import { computeCheck, type ComputedCheck } from '../../checks/compute.ts';
import { comparePairs } from '../../vibration/index.ts';
import { VERDICT_MARKS, type MarkVerdict } from '../../checks/verdict-mark.ts';
import { describeSource } from '../../schemas/excitation.ts';
import { dayTimeUtc } from '../../format.ts';
import { frequency, inUnit, pairLabel, type FrequencyUnit } from '../../frequency.ts';
import * as followUpQueries from '../db/follow-ups.ts';

export const CAUTIONS = [
	'Impact testing is done with the machine stopped, locked out and tagged out, unless a site procedure allows otherwise.',
	'Follow the plant procedures, the machine maker limits and local codes.',
	'These results support, but never replace, the judgement of a qualified engineer.'
];

const ink = '#111318';
const muted = '#4a505c';
/** the light theme's verdict colours (src/app.css) */
const MARK_COLOURS: Record<MarkVerdict, string> = {
	clear: '#1b7a3a',
	tight: '#8a4b00',
	conflict: '#b3261e',
	unchecked: '#4f5866'
};
const accent = '#0b6e69';
const pct = (v: number | null) => (v === null ? '-' : `${v.toFixed(1)} %`);
const when = (t: number | null) => (t === null ? '-' : dayTimeUtc(t));

function toBuffer(doc: PDFKit.PDFDocument): Promise<Buffer> {
	return new Promise((resolve, reject) => {
		const chunks: Buffer[] = [];
		doc.on('data', (c: Buffer) => chunks.push(c));
		doc.on('end', () => resolve(Buffer.concat(chunks)));
		doc.on('error', reject);
		doc.end();
	});
}

/** A line of small grey text (a legend, a caution, a remark), then back to body text. */
function smallNote(doc: PDFKit.PDFDocument, text: string) {
	doc.fontSize(8).fillColor(muted).text(text).fillColor(ink).fontSize(9.5);
}

/** A chart's note, back at the left margin at `y` below the drawing. */
function noteBelow(doc: PDFKit.PDFDocument, y: number, text: string) {
	doc.fillColor(ink).fontSize(9.5);
	doc.x = doc.page.margins.left;
	doc.y = y;
	smallNote(doc, text);
}

function heading(doc: PDFKit.PDFDocument, text: string) {
	if (doc.y > 720) doc.addPage();
	doc
		.moveDown(0.6)
		.font('Bold')
		.fontSize(13)
		.fillColor(accent)
		.text(text)
		.moveDown(0.2)
		.font('Body')
		.fontSize(9.5)
		.fillColor(ink);
}

/**
 * Detune's verdict mark (src/lib/checks/verdict-mark.ts), drawn as vectors at (x, y) with the
 * given size: the same shape and fill as on screen, so it reads in greyscale print too.
 */
function verdictMark(
	doc: PDFKit.PDFDocument,
	verdict: MarkVerdict,
	x: number,
	y: number,
	size: number
) {
	const colour = MARK_COLOURS[verdict];
	doc.save();
	doc.translate(x, y).scale(size / 24);
	for (const s of VERDICT_MARKS[verdict]) {
		if (s.fill === 'solid') doc.path(s.d).fill(colour);
		else if (s.fill === 'hatch') {
			doc.save();
			doc.path(s.d).clip();
			for (let k = -24; k < 48; k += 3) doc.moveTo(k, 24).lineTo(k + 24, 0);
			doc.lineWidth(1.2).stroke(colour);
			doc.restore();
		} else {
			doc.path(s.d).lineWidth(s.stroke);
			if (s.dash) doc.dash(s.dash[0], { space: s.dash[1] });
			doc.stroke(s.fill === 'knockout' ? '#ffffff' : colour);
			doc.undash();
		}
	}
	doc.restore();
}

/** A verdict: its mark and its word (never the colour alone). */
function verdictText(
	doc: PDFKit.PDFDocument,
	verdict: MarkVerdict,
	x: number,
	y: number,
	size = 9
) {
	verdictMark(doc, verdict, x, y, size);
	doc.text(verdict.toUpperCase(), x + size + 3, y, { lineBreak: false });
}

type Cell = string | { verdict: MarkVerdict };

function table(doc: PDFKit.PDFDocument, head: string[], rows: Cell[][], widths: number[]) {
	const x0 = doc.page.margins.left;
	const line = (cells: Cell[], bold = false) => {
		if (doc.y > 760) doc.addPage();
		const y = doc.y;
		let x = x0;
		doc.font(bold ? 'Bold' : 'Body').fontSize(8.5);
		let h = 0;
		cells.forEach((c, i) => {
			if (typeof c === 'string') doc.text(c, x, y, { width: widths[i] - 4 });
			else {
				verdictText(doc, c.verdict, x, y, 8);
				doc.y = y + 10;
			}
			h = Math.max(h, doc.y - y);
			x += widths[i];
		});
		doc.y = y + h + 2;
		doc.x = x0;
	};
	line(head, true);
	for (const r of rows) line(r);
	doc.font('Body').fontSize(9.5);
}

/** Frequency against speed: excitation lines, natural frequencies with their margin bands, the range, the speed. */
/** The diagram's height on the page, ticks and caption included, pt. */
const DIAGRAM_HEIGHT = 280;

/** Round ticks covering [lo, hi]: multiples of 1, 2, 2.5 or 5 × 10^k, about five of them. */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
	const span = Math.max(hi - lo, 1e-9);
	const raw = span / count;
	const pow = 10 ** Math.floor(Math.log10(raw));
	const step = [1, 2, 2.5, 5, 10].map((m) => m * pow).find((s) => s >= raw) ?? 10 * pow;
	const first = Math.floor(lo / step) * step;
	const ticks: number[] = [];
	for (let t = first; t < hi + step * 0.999; t += step) ticks.push(Number(t.toPrecision(12)));
	return ticks;
}

const tickText = (v: number) =>
	Number.isInteger(v) ? String(v) : String(Number(v.toPrecision(4)));

function diagram(
	doc: PDFKit.PDFDocument,
	c: ComputedCheck,
	minRpm: number,
	maxRpm: number,
	measured: number | null,
	modes: number[],
	unit: FrequencyUnit
) {
	if (doc.y > doc.page.height - doc.page.margins.bottom - DIAGRAM_HEIGHT) doc.addPage();
	const perHz = inUnit(1, unit);
	const X = doc.page.margins.left + 40;
	const Y = doc.y + 10;
	const W = 400;
	const H = 220;
	// axes on round numbers: the ticks are multiples of a 1, 2, 2.5 or 5 step
	const xt = niceTicks(
		Math.max(0, Math.min(minRpm, measured ?? minRpm) * 0.75),
		Math.max(maxRpm, measured ?? maxRpm) * 1.15
	);
	const x0 = xt[0];
	const x1 = xt[xt.length - 1];
	// the frequency axis on round numbers of the reader's unit; drawn in Hz
	const yt = niceTicks(0, Math.max(10, ...modes.map((f) => f * 1.5), (x1 / 60) * 1.2) * perHz);
	const yMax = yt[yt.length - 1] / perHz;
	const sx = (r: number) => X + ((r - x0) / (x1 - x0)) * W;
	const sy = (f: number) => Y + H - (Math.min(f, yMax) / yMax) * H;
	// lines run on past the top and are clipped there (clamped, they all met in the corner)
	const syLine = (f: number) => Y + H - (f / yMax) * H;
	doc.save();
	doc.rect(sx(minRpm), Y, Math.max(1, sx(maxRpm) - sx(minRpm)), H).fill('#e9ebe5');
	for (const b of c.bands.bands)
		doc
			.rect(sx(b.lowRpm), Y, Math.max(1, sx(b.highRpm) - sx(b.lowRpm)), H)
			.fillOpacity(0.35)
			.fill('#f9dcd9')
			.fillOpacity(1);
	modes.forEach((fn, i) => {
		const req =
			Math.max(
				0,
				...c.result.pairs.filter((p) => p.modeIndex === i).map((p) => p.requiredOverRangePct)
			) / 100;
		const lo = fn / (1 + req);
		const hi = req < 1 ? fn / (1 - req) : yMax;
		doc
			.rect(X, sy(hi), W, Math.max(0.5, sy(lo) - sy(hi)))
			.fillOpacity(0.25)
			.fill('#f5b451')
			.fillOpacity(1);
		doc
			.moveTo(X, sy(fn))
			.lineTo(X + W, sy(fn))
			.lineWidth(1.5)
			.stroke('#8a4b00');
		doc
			.fontSize(7)
			.fillColor(ink)
			.text(frequency(fn, unit, 1), X + W + 2, sy(fn) - 3);
	});
	doc.rect(X, Y, W, H).clip();
	// each line named where it leaves the plot (the right edge, or the top)
	const labels: { text: string; x: number; y: number }[] = [];
	for (const l of c.result.lines) {
		const endF = l.order !== null ? (l.order * x1) / 60 : (l.fixedHz as number);
		if (endF <= yMax) labels.push({ text: l.label, x: X + W + 2, y: sy(endF) - 3 });
		else if (l.order !== null)
			labels.push({ text: l.label, x: sx((yMax * 60) / l.order) - 10, y: Y - 9 });
	}
	for (const l of c.result.lines) {
		if (l.order !== null)
			doc
				.moveTo(sx(x0), syLine((l.order * x0) / 60))
				.lineTo(sx(x1), syLine((l.order * x1) / 60))
				.lineWidth(0.8)
				.stroke(accent);
		else
			doc
				.moveTo(X, sy(l.fixedHz as number))
				.lineTo(X + W, sy(l.fixedHz as number))
				.dash(3, { space: 2 })
				.lineWidth(0.8)
				.stroke(accent)
				.undash();
	}
	if (measured !== null)
		doc
			.moveTo(sx(measured), Y)
			.lineTo(sx(measured), Y + H)
			.lineWidth(1.5)
			.stroke(ink);
	doc.restore();
	doc.rect(X, Y, W, H).lineWidth(0.5).stroke(muted);
	doc.fontSize(7.5).fillColor(muted);
	for (const r of xt)
		doc.text(tickText(r), sx(r) - 18, Y + H + 3, { width: 36, align: 'center', lineBreak: false });
	for (const f of yt)
		doc.text(tickText(f), X - 34, sy(f / perHz) - 3, {
			width: 30,
			align: 'right',
			lineBreak: false
		});
	doc.fontSize(6.5).fillColor(accent);
	let lastY = -Infinity;
	for (const l of labels.sort((a, b) => a.y - b.y)) {
		// labels at the right edge never overlap: each at least a line below the last
		const y = l.x > X + W ? Math.max(l.y, lastY + 7) : l.y;
		if (l.x > X + W) lastY = y;
		doc.text(l.text, l.x, y, { lineBreak: false });
	}
	doc.fillColor(muted);
	doc.text('shaft speed (rpm)', X, Y + H + 14, { width: W, align: 'center' });
	doc.text(unit, X - 32, Y - 10);
	noteBelow(
		doc,
		Y + H + 30,
		'Lines: excitation orders (solid) and fixed frequencies (dashed). Bands: each natural frequency with its required margin. Grey: the speed range; red: avoidance bands; black: the measured speed.'
	);
}

function cautions(doc: PDFKit.PDFDocument) {
	heading(doc, 'Cautions');
	for (const c of CAUTIONS) doc.text(`- ${c}`);
	const missing = missingGlyphs.get(doc)?.() ?? 0;
	if (missing > 0)
		smallNote(
			doc.moveDown(0.5),
			`${missing} character${missing === 1 ? ' in names or notes is' : 's in names or notes are'} outside the report's font (Inter: Latin, Greek, Cyrillic) and print as "?"; the screen shows them as typed.`
		);
}

const missingGlyphs = new WeakMap<PDFKit.PDFDocument, () => number>();

function newReport(title: string): PDFKit.PDFDocument {
	const doc = new PDFDocument({
		size: 'A4',
		margin: 48,
		bufferPages: true,
		info: { Title: title, Author: 'Detune' }
	});
	missingGlyphs.set(doc, useInter(doc));
	return doc;
}

function loadCheck(checkId: string) {
	const check = checkQueries.byId(checkId);
	if (!check) return null;
	const sheet = assetQueries.sheet(check.assetId);
	if (!sheet) return null;
	const modes = checkQueries.modesOf(check.id);
	const by =
		db.select({ name: users.name }).from(users).where(eq(users.id, check.userId)).get()?.name ??
		'unknown';
	const reviewer = check.reviewedBy
		? (db.select({ name: users.name }).from(users).where(eq(users.id, check.reviewedBy)).get()
				?.name ?? null)
		: null;
	const c = computeCheck(
		{ ...sheet.asset, sources: sheet.sources },
		sheet.ruleSet,
		check.measuredRpm,
		modes.map((m) => ({ frequencyHz: m.frequencyHz, dampingRatio: m.dampingRatio }))
	);
	return { check, sheet, modes, by, reviewer, c };
}

/** The check's overall vibration level and its zone, with how it was reached and the caution. */
function severitySection(
	doc: PDFKit.PDFDocument,
	check: { overallVelocityMmS: number | null; severityZone: string | null; severity: unknown }
) {
	heading(doc, 'Vibration severity');
	if (check.overallVelocityMmS === null) {
		doc.text('No overall vibration level was taken with this check.');
		return;
	}
	const o = check.severity as SeverityOutcome | null;
	if (!o || o.status !== 'zoned') {
		doc.text(
			`Overall velocity ${check.overallVelocityMmS} mm/s r.m.s.; no zone: ${o ? o.message : 'not evaluated.'}`
		);
		return;
	}
	doc.text(
		`Overall velocity ${check.overallVelocityMmS} mm/s r.m.s.: zone ${o.zone}, ${ZONE_MEANING[o.zone]}. ${o.support === 'rigid' ? 'Rigid' : 'Flexible'} support${o.supportAssumed ? ' (assumed: no natural frequency known)' : ' (from the lowest natural frequency against running speed)'}; boundaries A/B ${o.limits.abMmS}, B/C ${o.limits.bcMmS}, C/D ${o.limits.cdMmS} mm/s; measured over ${o.band.lowHz}-${o.band.highHz} Hz.`
	);
	smallNote(
		doc,
		'Zone boundaries as quoted from ISO 20816-3 Annex A or as set on site: confirm them against the licensed standard and the machine maker’s limits.'
	);
}

function checkSection(
	doc: PDFKit.PDFDocument,
	d: NonNullable<ReturnType<typeof loadCheck>>,
	unit: FrequencyUnit
) {
	const { check, sheet, modes, c } = d;
	const f = (hz: number) => frequency(hz, unit);
	heading(doc, `Check of ${when(check.checkedAt)}`);
	doc.text(
		`Measured by ${d.by}; received ${when(check.receivedAt)}; measured speed ${check.measuredRpm ?? '-'} rpm.`
	);
	doc.text(
		d.reviewer
			? `Reviewed by ${d.reviewer} on ${when(check.reviewedAt)}${check.reviewComment ? `: ${check.reviewComment}` : ''}.`
			: 'Not reviewed yet.'
	);
	doc.text(
		check.notes.trim() ? `Technician's notes: ${check.notes.trim()}` : 'No notes with this check.'
	);
	doc.text(
		`Rule: ${sheet.ruleSet ? `${sheet.ruleSet.name} (${sheet.ruleSet.source}${sheet.ruleSet.edition ? `, ${sheet.ruleSet.edition}` : ''})` : 'Detune default 10 % (common practice)'}. Margin = |fn - fe| / fe.`
	);
	doc.moveDown(0.3).font('Bold').fontSize(12);
	const vy = doc.y;
	const x0 = doc.page.margins.left;
	doc.text('Verdict over the speed range:', x0, vy, { lineBreak: false });
	verdictText(doc, c.result.verdict, x0 + 180, vy, 12);
	doc.text('at the measured speed:', x0 + 290, vy, { lineBreak: false });
	verdictText(doc, c.result.verdictAtSpeed, x0 + 430, vy, 12);
	doc.x = x0;
	doc.y = vy + 18;
	doc.font('Body').fontSize(9.5);
	severitySection(doc, check);
	heading(doc, 'Natural frequencies');
	// a recorded mode's quality flags, from the server's analysis of its file
	const flagsOf = (m: (typeof modes)[number]): string => {
		if (!m.recordingId) return '-';
		const rec = db.select().from(recordings).where(eq(recordings.id, m.recordingId)).get();
		const found = (rec?.analysis as unknown as StoredAnalysis | null)?.modes.find(
			(q) => Math.abs(q.frequencyHz - m.frequencyHz) <= 0.005 * m.frequencyHz
		);
		return found?.flags.length ? found.flags.map((f) => f.replace(/-/g, ' ')).join(', ') : 'none';
	};
	table(
		doc,
		['Frequency', 'Damping ratio', 'Direction', 'Location', 'From', 'Quality flags'],
		modes.map((m) => [
			f(m.frequencyHz),
			m.dampingRatio === null ? '-' : m.dampingRatio.toFixed(4),
			m.direction ?? '-',
			m.location ?? '-',
			m.origin,
			flagsOf(m)
		]),
		[62, 62, 62, 140, 56, 118]
	);
	heading(doc, 'Separation margins');
	const pairs = [...c.result.pairs].sort((a, b) => comparePairs(a, b, 'range'));
	table(
		doc,
		[
			'Natural freq.',
			'Excitation',
			'At speed',
			'Margin at speed',
			'Required',
			'Margin over range',
			'Required',
			'Verdict'
		],
		pairs.map((p) => [
			f(p.naturalHz),
			p.label,
			p.excitationHz === null ? '-' : f(p.excitationHz),
			pct(p.marginAtSpeedPct),
			pct(p.requiredAtSpeedPct),
			pct(p.marginOverRangePct),
			pct(p.requiredOverRangePct),
			{ verdict: p.verdictOverRange }
		]),
		[62, 96, 58, 60, 50, 62, 50, 52]
	);
	// what a bare "clear" would hide (a line sweeping across a mode the rule lets pass)
	for (const p of pairs.filter((q) => q.remark))
		smallNote(doc, `${pairLabel(p.naturalHz, p.label, unit)}: ${p.remark}`);
	heading(doc, 'Avoidance bands');
	if (c.bands.bands.length === 0) doc.text('No speed in the range is inside a required margin.');
	// the drive's entry in the three ways drives take it: low/high, centre + width, start + width
	for (const b of c.bands.bands) {
		const lo = b.driveLowHz;
		const hi = b.driveHighHz;
		doc.text(
			`Shaft ${b.lowRpm.toFixed(0)}-${b.highRpm.toFixed(0)} rpm; motor ${b.motorLowRpm.toFixed(0)}-${b.motorHighRpm.toFixed(0)} rpm${lo !== null && hi !== null ? `; drive low/high ${lo.toFixed(1)}/${hi.toFixed(1)} Hz, centre + width ${((lo + hi) / 2).toFixed(1)} + ${(hi - lo).toFixed(1)} Hz, start + width ${lo.toFixed(1)} + ${(hi - lo).toFixed(1)} Hz` : ''}`
		);
	}
	for (const w of c.bands.warnings) doc.text(w);
	if (c.bands.bands.length) smallNote(doc, c.bands.slipNote);
	// the heading goes with its diagram: a new page when both do not fit
	if (doc.y > doc.page.height - doc.page.margins.bottom - DIAGRAM_HEIGHT - 40) doc.addPage();
	heading(doc, 'Interference diagram');
	diagram(
		doc,
		c,
		sheet.asset.minRpm,
		sheet.asset.maxRpm,
		check.measuredRpm,
		modes.map((m) => m.frequencyHz),
		unit
	);
}

function assetHeader(
	doc: PDFKit.PDFDocument,
	sheet: NonNullable<ReturnType<typeof assetQueries.sheet>>,
	title: string,
	unit: FrequencyUnit
) {
	doc.font('Bold').fontSize(18).fillColor(ink).text(`Detune - ${title}`);
	doc
		.font('Body')
		.fontSize(9)
		.fillColor(muted)
		.text(
			`Generated ${when(Date.now())}. Frequencies in ${unit === 'CPM' ? 'CPM, cycles per minute (1 Hz = 60 CPM)' : 'Hz'}; speeds in rpm.`
		)
		.fillColor(ink)
		.fontSize(9.5);
	heading(doc, `${sheet.asset.tag} - ${sheet.asset.name}`);
	const a = sheet.asset;
	doc.text(
		`Site: ${sheet.site.name}${sheet.area ? ` / ${sheet.area.name}` : ''}. Machine: ${a.machineKind}, ${a.driveType === 'vfd' ? 'variable-speed drive' : 'fixed speed'}.`
	);
	doc.text(
		`Speed range: ${a.minRpm === a.maxRpm ? `${a.minRpm} rpm` : `${a.minRpm}-${a.maxRpm} rpm`}${a.nominalRpm ? `, nominal ${a.nominalRpm} rpm` : ''}. Motor poles ${a.motorPoles ?? '-'}, drive ratio ${a.driveRatio}, skip bands ${a.skipBands}.`
	);
	doc.text(sheet.sources.length ? 'Excitation sources:' : 'Excitation sources: none entered.');
	for (const s of sheet.sources) doc.text(`- ${describeSource(s.kind, s.label, s.params, unit)}`);
}

/** The follow-ups of a check (or of the whole asset), with their status. */
function followUpSection(doc: PDFKit.PDFDocument, assetId: string, checkId: string | null) {
	const items = followUpQueries
		.list({ assetId })
		.filter((f) => checkId === null || f.checkId === checkId);
	heading(doc, 'Follow-ups');
	if (items.length === 0) {
		doc.text(checkId ? 'None raised from this check.' : 'None for this asset.');
		return;
	}
	table(
		doc,
		['Follow-up', 'Status', 'Due', 'Assigned to'],
		items.map((f) => [f.title, f.status, f.dueDate ?? '-', f.assigneeName ?? 'not assigned']),
		[220, 70, 80, 130]
	);
}

/** Where the qualified engineer signs the report off for the machine file. */
function signOff(doc: PDFKit.PDFDocument) {
	if (doc.y > doc.page.height - doc.page.margins.bottom - 110) doc.addPage();
	heading(doc, 'Sign-off');
	doc.text('Reviewed for the machine file by a qualified engineer:');
	const x0 = doc.page.margins.left;
	for (const label of ['Name', 'Position', 'Date', 'Signature']) {
		doc.moveDown(0.9);
		const y = doc.y;
		doc.text(`${label}:`, x0, y, { lineBreak: false });
		doc
			.moveTo(x0 + 70, y + 10)
			.lineTo(x0 + 330, y + 10)
			.lineWidth(0.6)
			.stroke(muted);
		doc.x = x0;
		doc.y = y + 12;
	}
}

/**
 * The worst margin over the speed range at each check, oldest to newest, as a line on round ticks,
 * each point in its verdict's colour; a check with a mode inside the range counts as 0 %.
 */
function marginTrend(
	doc: PDFKit.PDFDocument,
	history: { checkedAt: number; worstMarginOverRangePct: number | null; verdict: string }[]
) {
	const pts = [...history]
		.sort((a, b) => a.checkedAt - b.checkedAt)
		.map((h) => ({ t: h.checkedAt, m: h.worstMarginOverRangePct ?? 0, v: h.verdict }));
	const X = doc.page.margins.left + 40;
	const Y = doc.y + 6;
	const W = 400;
	const H = 120;
	const yt = niceTicks(0, Math.max(10, ...pts.map((p) => p.m)) * 1.1);
	const yMax = yt[yt.length - 1];
	const t0 = pts[0].t;
	const t1 = Math.max(pts[pts.length - 1].t, t0 + 1);
	const sx = (t: number) => X + ((t - t0) / (t1 - t0)) * W;
	const sy = (m: number) => Y + H - (m / yMax) * H;
	doc.rect(X, Y, W, H).lineWidth(0.5).stroke(muted);
	doc.fontSize(7.5).fillColor(muted);
	for (const f of yt) {
		doc.text(`${tickText(f)} %`, X - 38, sy(f) - 3, {
			width: 34,
			align: 'right',
			lineBreak: false
		});
		doc
			.moveTo(X, sy(f))
			.lineTo(X + W, sy(f))
			.lineWidth(0.3)
			.stroke('#d6d9d2');
	}
	doc.text(when(t0), X - 20, Y + H + 3, { width: 120, lineBreak: false });
	doc.text(when(t1), X + W - 100, Y + H + 3, { width: 120, align: 'right', lineBreak: false });
	pts.forEach((p, i) => {
		if (i > 0)
			doc
				.moveTo(sx(pts[i - 1].t), sy(pts[i - 1].m))
				.lineTo(sx(p.t), sy(p.m))
				.lineWidth(1.2)
				.stroke(accent);
	});
	for (const p of pts)
		doc
			.circle(sx(p.t), sy(p.m), 2.5)
			.fill(
				MARK_COLOURS[(p.v as MarkVerdict) in MARK_COLOURS ? (p.v as MarkVerdict) : 'unchecked']
			);
	noteBelow(
		doc,
		Y + H + 16,
		'Worst separation margin over the speed range at each check (0 % where a mode sits inside it).'
	);
}

/** "Page 2 of 3" at the foot of every page, once all pages exist. */
function pageNumbers(doc: PDFKit.PDFDocument, title: string) {
	const range = doc.bufferedPageRange();
	for (let i = range.start; i < range.start + range.count; i++) {
		doc.switchToPage(i);
		const bottom = doc.page.margins.bottom;
		doc.page.margins.bottom = 0; // writing in the margin must not open a new page
		doc
			.font('Body')
			.fontSize(8)
			.fillColor(muted)
			.text(
				`${title} · page ${i + 1} of ${range.count}`,
				doc.page.margins.left,
				doc.page.height - 30,
				{
					width: doc.page.width - doc.page.margins.left - doc.page.margins.right,
					align: 'center',
					lineBreak: false
				}
			);
		doc.page.margins.bottom = bottom;
	}
}

/** A check's report; natural and forcing frequencies in `unit` (the reader's choice). */
export async function checkReport(
	checkId: string,
	unit: FrequencyUnit = 'Hz'
): Promise<{ pdf: Buffer; tag: string } | null> {
	const d = loadCheck(checkId);
	if (!d) return null;
	const doc = newReport(`Detune check ${d.sheet.asset.tag}`);
	assetHeader(doc, d.sheet, 'resonance check report', unit);
	checkSection(doc, d, unit);
	followUpSection(doc, d.sheet.asset.id, d.check.id);
	signOff(doc);
	cautions(doc);
	pageNumbers(doc, `${d.sheet.asset.tag} check of ${when(d.check.checkedAt)}`);
	return { pdf: await toBuffer(doc), tag: d.sheet.asset.tag };
}

/** An asset's report; natural and forcing frequencies in `unit` (the reader's choice). */
export async function assetReport(
	assetId: string,
	unit: FrequencyUnit = 'Hz'
): Promise<{ pdf: Buffer; tag: string } | null> {
	const sheet = assetQueries.sheet(assetId);
	if (!sheet) return null;
	const history = db
		.select()
		.from(checks)
		.where(eq(checks.assetId, assetId))
		.orderBy(desc(checks.checkedAt))
		.all();
	const doc = newReport(`Detune asset ${sheet.asset.tag}`);
	assetHeader(doc, sheet, 'asset resonance report', unit);
	if (history.length >= 2) {
		if (doc.y > doc.page.height - doc.page.margins.bottom - 200) doc.addPage();
		heading(doc, 'Margin trend');
		marginTrend(doc, history);
	}
	heading(doc, 'Check history');
	if (history.length === 0) doc.text('No checks yet.');
	else
		table(
			doc,
			['When', 'Speed', 'Worst at speed', 'Worst over range', 'Verdict', 'Vibration'],
			history.map((h) => [
				when(h.checkedAt),
				`${h.measuredRpm ?? '-'} rpm`,
				pct(h.worstMarginAtSpeedPct),
				pct(h.worstMarginOverRangePct),
				{ verdict: h.verdict },
				h.overallVelocityMmS === null
					? '-'
					: `${h.overallVelocityMmS} mm/s${h.severityZone ? `, zone ${h.severityZone}` : ''}`
			]),
			[110, 60, 80, 90, 80, 90]
		);
	const latest = history[0] ? loadCheck(history[0].id) : null;
	if (latest) checkSection(doc, latest, unit);
	followUpSection(doc, sheet.asset.id, null);
	signOff(doc);
	cautions(doc);
	pageNumbers(doc, `${sheet.asset.tag} asset report`);
	return { pdf: await toBuffer(doc), tag: sheet.asset.tag };
}
