import { beforeAll, describe, expect, it } from 'vitest';
import { desc, eq } from 'drizzle-orm';
// pdf-parse (registry, on Mozilla's pdf.js): an independent reader for what the report says
import { PDFParse } from 'pdf-parse';
import { freshDatabase } from '../test-db.ts';
import { db } from '../db/index.ts';
import { assets, checks, modes, ruleSets } from '../db/schema.ts';
import { assetReport, checkReport, CAUTIONS, niceTicks } from './pdf.ts';
import { users } from '../db/schema.ts';
import * as followUps from '../db/follow-ups.ts';
import { describeSource } from '../../schemas/excitation.ts';
import { computeCheck } from '../../checks/compute.ts';
import * as assetQueries from '../db/assets.ts';
import * as checkQueries from '../db/checks.ts';

beforeAll(async () => {
	await freshDatabase({ demo: true });
});

const pagesOf = async (pdf: Buffer) => {
	const parser = new PDFParse({ data: new Uint8Array(pdf) });
	const r = await parser.getText();
	await parser.destroy();
	return r.pages.map((p) => p.text.replace(/\s+/g, ' '));
};

const textOf = async (pdf: Buffer) => {
	const parser = new PDFParse({ data: new Uint8Array(pdf) });
	const r = await parser.getText();
	await parser.destroy();
	return r.text.replace(/\s+/g, ' ');
};

const latestCheck = (assetId: string) =>
	db
		.select()
		.from(checks)
		.where(eq(checks.assetId, assetId))
		.orderBy(desc(checks.checkedAt))
		.limit(1)
		.get()!;

describe('PDF reports', () => {
	it('a check report holds the asset tag, every margin, the verdict and the cautions', async () => {
		const asset = db.select().from(assets).where(eq(assets.tag, 'KRW-RWP-103')).get()!;
		const check = latestCheck(asset.id);
		const r = await checkReport(check.id);
		expect(r!.pdf.subarray(0, 5).toString()).toBe('%PDF-');
		const text = await textOf(r!.pdf);
		expect(text).toContain('KRW-RWP-103');
		const sheet = assetQueries.sheet(asset.id)!;
		const c = computeCheck(
			{ ...sheet.asset, sources: sheet.sources },
			sheet.ruleSet,
			check.measuredRpm,
			checkQueries
				.modesOf(check.id)
				.map((m) => ({ frequencyHz: m.frequencyHz, dampingRatio: m.dampingRatio }))
		);
		expect(c.result.pairs.length).toBeGreaterThan(3);
		for (const p of c.result.pairs) {
			expect(text).toContain(`${p.marginOverRangePct.toFixed(1)} %`);
			if (p.marginAtSpeedPct !== null) expect(text).toContain(`${p.marginAtSpeedPct.toFixed(1)} %`);
		}
		expect(text).toContain(c.result.verdict.toUpperCase());
		for (const caution of CAUTIONS) expect(text).toContain(caution);
	});

	it('writes natural and forcing frequencies in CPM for a reader who chose CPM', async () => {
		// 1 Hz = 60 CPM by definition; the same check, read by a user of each unit
		const asset = db.select().from(assets).where(eq(assets.tag, 'KRW-RWP-103')).get()!;
		const check = latestCheck(asset.id);
		const inCpm = await textOf((await checkReport(check.id, 'CPM'))!.pdf);
		const inHz = await textOf((await checkReport(check.id, 'Hz'))!.pdf);
		expect(inCpm).toContain('Frequencies in CPM, cycles per minute (1 Hz = 60 CPM)');
		expect(inHz).toContain('Frequencies in Hz');
		const ms = checkQueries.modesOf(check.id);
		expect(ms.length).toBeGreaterThan(0);
		for (const m of ms) {
			expect(inCpm).toContain(`${(m.frequencyHz * 60).toFixed(0)} CPM`);
			expect(inCpm).not.toContain(`${m.frequencyHz.toFixed(2)} Hz`);
			expect(inHz).toContain(`${m.frequencyHz.toFixed(2)} Hz`);
		}
		// the diagram's axis is named in the reader's unit
		expect(inCpm).toMatch(/ CPM /);
	});

	it('an asset report holds the history and the cautions', async () => {
		const asset = db.select().from(assets).where(eq(assets.tag, 'LBM-IDF-110')).get()!;
		const text = await textOf((await assetReport(asset.id))!.pdf);
		expect(text).toContain('LBM-IDF-110');
		expect(text).toContain('Check history');
		// the demo asset has a history of checks: its margins drawn as a trend
		expect(text).toContain('Margin trend');
		expect(text).toContain('Worst separation margin over the speed range at each check');
		for (const caution of CAUTIONS) expect(text).toContain(caution);
	});

	it('prints Latin, Greek and Cyrillic names as typed, and says so for a character outside the font', async () => {
		const asset = db.select().from(assets).where(eq(assets.tag, 'LBM-IDF-110')).get()!;
		db.update(assets).set({ name: 'Pumpe Ω Ж' }).where(eq(assets.id, asset.id)).run();
		try {
			const text = await textOf((await assetReport(asset.id))!.pdf);
			expect(text).toContain('Pumpe Ω Ж');
			expect(text).not.toMatch(/outside the report's font/);
			db.update(assets).set({ name: 'Pumpe Ω Ж 泵' }).where(eq(assets.id, asset.id)).run();
			const cjk = await textOf((await assetReport(asset.id))!.pdf);
			expect(cjk).toContain('Pumpe Ω Ж ?');
			expect(cjk).toMatch(/1 character in names or notes is outside the report's font/);
		} finally {
			db.update(assets).set({ name: asset.name }).where(eq(assets.id, asset.id)).run();
		}
	});

	it('prints the remark of a line that sweeps across a mode the rule lets pass', async () => {
		// LBM-IDF-110 runs 500–1,190 rpm (8.3–19.8 Hz at 1×): a 15 Hz mode with ζ 0.25 (AF 2) is
		// crossed, and under the amplification rule needs no margin, so it reads "clear" with a remark
		const asset = db.select().from(assets).where(eq(assets.tag, 'LBM-IDF-110')).get()!;
		const rule = db.select().from(ruleSets).where(eq(ruleSets.kind, 'amplification')).get()!;
		db.update(assets).set({ ruleSetId: rule.id }).where(eq(assets.id, asset.id)).run();
		const check = latestCheck(asset.id);
		db.insert(modes)
			.values({
				id: crypto.randomUUID(),
				checkId: check.id,
				frequencyHz: 15,
				dampingRatio: 0.25,
				direction: 'horizontal',
				location: null,
				origin: 'typed',
				recordingId: null
			})
			.run();
		const text = await textOf((await checkReport(check.id))!.pdf);
		expect(text).toContain('15.00 Hz ×');
		expect(text).toContain('the rule asks no margin (amplification factor below 2.5');
	});

	it('a check report for the machine file: sources in words, notes, follow-ups, sign-off, page numbers', async () => {
		// before: sources printed as code (`vane {"count":5}`), no notes, no follow-ups, no pages
		const asset = db.select().from(assets).where(eq(assets.tag, 'KRW-RWP-101')).get()!;
		const check = latestCheck(asset.id);
		db.update(checks)
			.set({ notes: 'Coupling guard loose; base bolts re-torqued before the test.' })
			.where(eq(checks.id, check.id))
			.run();
		const planner = db.select().from(users).where(eq(users.role, 'planner')).get()!;
		const tech = db.select().from(users).where(eq(users.email, 'tech@example.com')).get()!;
		followUps.create(
			{
				assetId: asset.id,
				checkId: check.id,
				title: 'Brace the motor stand and retest',
				assigneeId: tech.id,
				dueDate: '2027-03-01',
				priority: 'high',
				notes: ''
			},
			planner.id
		);
		const pages = await pagesOf((await checkReport(check.id))!.pdf);
		const text = pages.join(' ');
		expect(text).not.toContain('{');
		const sheet = assetQueries.sheet(asset.id)!;
		expect(sheet.sources.length).toBeGreaterThan(0);
		for (const src of sheet.sources)
			expect(text).toContain(describeSource(src.kind, src.label, src.params));
		expect(text).toContain(
			"Technician's notes: Coupling guard loose; base bolts re-torqued before the test."
		);
		expect(text).toMatch(
			/Brace the motor stand and retest (open|scheduled) 2027-03-01 Tomas Ferreira/
		);
		expect(text).toContain('Quality flags');
		expect(text).toMatch(
			/drive low\/high [\d.]+\/[\d.]+ Hz, centre \+ width [\d.]+ \+ [\d.]+ Hz, start \+ width/
		);
		// the demo's latest check carries an invented level: its zone, how it was reached, the caution
		expect(check.overallVelocityMmS).not.toBeNull();
		expect(text).toContain('Vibration severity');
		expect(text).toContain(
			`Overall velocity ${check.overallVelocityMmS} mm/s r.m.s.: zone ${check.severityZone}`
		);
		expect(text).toMatch(/measured over (2|10)-1000 Hz/);
		expect(text).toContain('confirm them against the licensed standard');
		expect(text).toContain('Sign-off');
		expect(text).toContain('Signature:');
		pages.forEach((p, i) => expect(p).toContain(`page ${i + 1} of ${pages.length}`));
		// the diagram's heading is on the page of the diagram itself (its axis caption)
		const headingPage = pages.findIndex((p) => p.includes('Interference diagram'));
		const diagramPage = pages.findIndex((p) => p.includes('shaft speed (rpm)'));
		expect(headingPage).toBeGreaterThanOrEqual(0);
		expect(headingPage).toBe(diagramPage);
		// no sign the report's font lacks: the ≥ of a remark prints as >=, never "?"
		expect(text).not.toMatch(/\? 2\.5/);
	});

	it('puts the diagram on round ticks', () => {
		// before, the axes were split in four: 143/107/71 Hz, 540/744/949 rpm
		expect(niceTicks(375, 1369)).toEqual([200, 400, 600, 800, 1000, 1200, 1400]);
		expect(niceTicks(0, 143)).toEqual([0, 50, 100, 150]);
		expect(niceTicks(0, 12)).toEqual([0, 2.5, 5, 7.5, 10, 12.5]);
		expect(niceTicks(540, 949)).toEqual([500, 600, 700, 800, 900, 1000]);
	});
});
