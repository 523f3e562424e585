/**
 * Asset import from CSV: every row validated first (row and column named in each message); then
 * all rows in one transaction, or none. A tag already in the database is updated, and its
 * excitation sources replaced by the row's when the row gives any.
 */
import Papa from 'papaparse';
import { eq } from 'drizzle-orm';
import { db } from './index.ts';
import { areas, assets, excitationSources, ruleSets, sites } from './schema.ts';
import { nextVersion } from './versions.ts';
import { refreshAsset } from './status.ts';
import * as audit from './audit.ts';
import { assetForm, type AssetForm } from '../../schemas/asset.ts';
import { sourceParams } from '../../schemas/excitation.ts';
import { toHz } from '../../frequency.ts';
import { decimalOrNull } from '../../schemas/form.ts';

export const IMPORT_COLUMNS = [
	['tag', 'unique asset tag (required)'],
	['name', 'asset name (required)'],
	['site_code', 'site code, e.g. KRW (required)'],
	['area', 'area name; created in the site if new'],
	['machine_kind', 'pump, fan, blower, compressor, motor, gearbox, refiner, agitator or other'],
	['drive_type', 'fixed or vfd'],
	['min_rpm', 'minimum shaft speed, rpm'],
	['max_rpm', 'maximum shaft speed, rpm (= min_rpm for fixed speed)'],
	['nominal_rpm', 'optional'],
	['motor_poles', 'optional, for drive output Hz (an even number)'],
	['slip_pct', 'optional, motor slip at rated load, %'],
	['drive_ratio', 'motor rpm ÷ shaft rpm; 1 for direct drive'],
	['skip_bands', 'skip bands the drive offers; default 3'],
	['rule_set', 'rule-set name; empty for the default'],
	['shaft_orders', 'e.g. 0.5;1;2'],
	['vane_count', 'pump vanes'],
	['blade_count', 'fan or blower blades'],
	['gear_teeth', 'teeth on the reference shaft'],
	['gear_mating_teeth', 'teeth on the mating gear'],
	['bearing_elements', 'rolling elements'],
	['bearing_element_mm', 'element diameter, mm'],
	['bearing_pitch_mm', 'pitch diameter, mm'],
	['bearing_angle_deg', 'contact angle, °'],
	['line_hz', 'mains frequency, for 2× line'],
	['fixed_hz', 'a fixed forcing frequency, Hz'],
	['fixed_cpm', 'or the same in CPM (cycles per minute); give one of the two'],
	[
		'machine_group',
		'vibration severity group: group1 (> 300 kW) or group2 (15–300 kW); empty: none'
	]
] as const;

export const TEMPLATE = [
	IMPORT_COLUMNS.map((c) => c[0]).join(','),
	'KRW-RWP-105,Raw water pump 5,KRW,Raw Water Intake,pump,vfd,720,1180,1180,6,1.7,1,3,Pump structures 15 %\\, vane pass 20 %,1;2,5,,,,9,25.4,115,0,60,,,group2',
	'LBM-EXF-130,Dryer exhaust fan,LBM,Dryer Section,fan,fixed,1180,1180,1180,6,,1,3,,1;2,,9,,,,,,,60,,,group2'
]
	.map((l) =>
		l.replace('Pump structures 15 %\\, vane pass 20 %', '"Pump structures 15 %, vane pass 20 %"')
	)
	.join('\r\n');

export interface RowError {
	row: number;
	column: string;
	message: string;
	/** what the cell held, when the problem is one cell's */
	value?: string;
}

interface ValidRow {
	row: number;
	tag: string;
	siteId: string;
	areaName: string | null;
	asset: AssetForm;
	sources: { kind: string; label: string; params: Record<string, unknown> }[];
}

const COLUMN_OF: Record<string, string> = {
	name: 'name',
	machineKind: 'machine_kind',
	driveType: 'drive_type',
	minRpm: 'min_rpm',
	maxRpm: 'max_rpm',
	nominalRpm: 'nominal_rpm',
	motorPoles: 'motor_poles',
	slipPct: 'slip_pct',
	driveRatio: 'drive_ratio',
	skipBands: 'skip_bands',
	ruleSetId: 'rule_set',
	machineGroup: 'machine_group'
};

/** The longest header row read: every known column, spaced and quoted, fits several times over. */
const MAX_HEADER_CHARS = 4096;

/**
 * What makes a text no asset list before any parsing: bytes of a binary file (a picture, a
 * spreadsheet saved as .xlsx) or a header row far longer than the known columns can make.
 */
function refuseText(text: string): string | null {
	const head = text.slice(0, 4096);
	if (head.startsWith('PK\u0003\u0004'))
		return 'This is a zipped file (an .xlsx workbook or similar), not CSV text; save the sheet as “CSV UTF-8” and load that.';
	// NUL, other C0 controls than tab/CR/LF, or the decoder's replacement character: not UTF-8 text
	// eslint-disable-next-line no-control-regex -- finding control characters is the point
	const odd = head.match(/[\u0000-\u0008\u000e-\u001f\ufffd]/g)?.length ?? 0;
	if (odd > 0 && odd >= head.length / 200)
		return 'This file is not CSV text (it holds binary bytes, as a picture or a spreadsheet does); save the sheet as “CSV UTF-8” and load that.';
	const end = text.search(/\r?\n/);
	const headerChars = end < 0 ? text.length : end;
	if (headerChars > MAX_HEADER_CHARS)
		return `The header row is ${headerChars.toLocaleString('en')} characters long; the known columns fit in ${MAX_HEADER_CHARS.toLocaleString('en')}. The template lists them.`;
	return null;
}

/** The one message for every unknown column: the first few by name, the count of the rest. */
function unknownColumns(headers: string[]): RowError | null {
	const known = new Set<string>(IMPORT_COLUMNS.map((c) => c[0]));
	const unknown = headers.filter((h) => !known.has(h));
	if (!unknown.length) return null;
	const named = unknown
		.slice(0, 5)
		.map((h) => `“${h.length > 40 ? h.slice(0, 40) + '…' : h}”`)
		.join(', ');
	const more = unknown.length > 5 ? ` and ${unknown.length - 5} more` : '';
	return {
		row: 1,
		column: unknown.length === 1 ? unknown[0] : '',
		message: `Unknown column${unknown.length === 1 ? '' : 's'} ${named}${more}; the template lists the columns.`
	};
}

/** The header's problems: unknown columns, missing ones, and what the CSV parser refused. */
function headerErrors(parsed: Papa.ParseResult<Record<string, string>>): RowError[] {
	const errors: RowError[] = [];
	const headers = parsed.meta.fields ?? [];
	const unknown = unknownColumns(headers);
	if (unknown) errors.push(unknown);
	for (const need of ['tag', 'name', 'site_code', 'min_rpm', 'max_rpm'])
		if (!headers.includes(need))
			errors.push({ row: 1, column: need, message: `The column “${need}” is missing.` });
	for (const e of parsed.errors)
		errors.push({ row: (e.row ?? 0) + 2, column: '', message: e.message });
	return errors;
}

/** One data row: its cells (trimmed) and the problems found in it, each with its column and value. */
function rowCells(raw: Record<string, string>, row: number, errors: RowError[]) {
	const get = (k: string) => (raw[k] ?? '').trim();
	const cells = {
		ok: true,
		has: (k: string) => k in raw,
		get,
		/** a number cell (decimal comma allowed), undefined when empty */
		n: (k: string) => decimalOrNull(get(k)) ?? undefined,
		fail(column: string, message: string) {
			cells.ok = false;
			const value = column && column in raw ? get(column) : undefined;
			errors.push({ row, column, message, ...(value !== undefined ? { value } : {}) });
		}
	};
	return cells;
}
type RowCells = ReturnType<typeof rowCells>;

/** The row's asset fields through the asset form's schema, with the import's defaults. */
function rowAsset(c: RowCells, ruleSetId: string | null) {
	const form = assetForm.safeParse({
		name: c.get('name'),
		machineKind: c.get('machine_kind') || 'other',
		driveType: c.get('drive_type') || (c.get('min_rpm') === c.get('max_rpm') ? 'fixed' : 'vfd'),
		minRpm: c.get('min_rpm'),
		maxRpm: c.get('max_rpm'),
		nominalRpm: c.get('nominal_rpm'),
		motorPoles: c.get('motor_poles'),
		slipPct: c.get('slip_pct'),
		driveRatio: c.get('drive_ratio') || '1',
		skipBands: c.get('skip_bands') || '3',
		ruleSetId: ruleSetId ?? '',
		// a file without the column leaves each asset's group as it is
		machineGroup: c.has('machine_group') ? c.get('machine_group') : undefined,
		notes: ''
	});
	if (!form.success)
		for (const issue of form.error.issues)
			c.fail(COLUMN_OF[String(issue.path[0])] ?? String(issue.path[0] ?? ''), issue.message);
	return form;
}

/** The row's excitation sources, each through its stored schema; a bad one fails its column. */
function rowSources(c: RowCells, asset: ReturnType<typeof rowAsset>): ValidRow['sources'] {
	const sources: ValidRow['sources'] = [];
	const add = (
		kind: keyof typeof sourceParams,
		column: string,
		params: Record<string, unknown>
	) => {
		const p = sourceParams[kind].safeParse(params);
		if (!p.success) for (const issue of p.error.issues) c.fail(column, issue.message);
		else sources.push({ kind, label: '', params: p.data as Record<string, unknown> });
	};
	const { get, n } = c;
	if (get('shaft_orders'))
		add('shaft', 'shaft_orders', {
			orders: get('shaft_orders')
				.split(/[;\s]+/)
				.filter(Boolean)
				.map(Number)
		});
	if (get('vane_count')) add('vane', 'vane_count', { count: n('vane_count') });
	if (get('blade_count')) add('blade', 'blade_count', { count: n('blade_count') });
	if (get('gear_teeth') || get('gear_mating_teeth'))
		add('gear', 'gear_teeth', { teeth: n('gear_teeth'), matingTeeth: n('gear_mating_teeth') });
	if (get('bearing_elements') || get('bearing_element_mm') || get('bearing_pitch_mm'))
		add('bearing', 'bearing_elements', {
			rollingElements: n('bearing_elements'),
			elementDiameter: (n('bearing_element_mm') ?? NaN) / 1000,
			pitchDiameter: (n('bearing_pitch_mm') ?? NaN) / 1000,
			contactAngleDeg: n('bearing_angle_deg') ?? 0
		});
	if (get('line_hz'))
		add('line', 'line_hz', {
			lineFrequencyHz: n('line_hz'),
			drive:
				asset.success && asset.data.driveType === 'vfd' && asset.data.motorPoles
					? { poles: asset.data.motorPoles, motorRpmPerShaftRpm: asset.data.driveRatio }
					: null
		});
	if (get('fixed_hz') && get('fixed_cpm'))
		c.fail('fixed_cpm', 'Give the fixed frequency once: in fixed_hz or in fixed_cpm, not both.');
	else if (get('fixed_hz')) add('fixed', 'fixed_hz', { frequencyHz: n('fixed_hz') });
	else if (get('fixed_cpm')) {
		// a value that is no number goes on to the schema, which names it
		const cpm = n('fixed_cpm') ?? NaN;
		add('fixed', 'fixed_cpm', { frequencyHz: Number.isFinite(cpm) ? toHz(cpm, 'CPM') : cpm });
	}
	return sources;
}

export function validate(text: string): { rows: ValidRow[]; errors: RowError[]; total: number } {
	text = text.replace(/^\uFEFF/, '');
	const refused = refuseText(text);
	if (refused) return { rows: [], errors: [{ row: 1, column: '', message: refused }], total: 0 };
	const parsed = Papa.parse<Record<string, string>>(text, {
		header: true,
		skipEmptyLines: 'greedy',
		transformHeader: (h) => h.trim().toLowerCase()
	});
	const errors = headerErrors(parsed);
	if (errors.length) return { rows: [], errors, total: parsed.data.length };
	const siteByCode = new Map(
		db
			.select()
			.from(sites)
			.all()
			.map((s) => [s.code.toUpperCase(), s])
	);
	const ruleByName = new Map(
		db
			.select()
			.from(ruleSets)
			.all()
			.map((r) => [r.name.toLowerCase(), r.id])
	);
	const seen = new Map<string, number>();
	const rows: ValidRow[] = [];
	// every problem of every row in one pass, so a file needs one round of corrections, not one
	// per row
	parsed.data.forEach((raw, i) => {
		const row = i + 2; // the header is row 1
		const c = rowCells(raw, row, errors);
		const tag = c.get('tag');
		if (!/^[A-Za-z0-9][A-Za-z0-9._/-]{1,39}$/.test(tag))
			c.fail('tag', 'Tag: 2–40 letters, digits, dots, dashes or slashes.');
		else if (seen.has(tag)) c.fail('tag', `Tag ${tag} is also on row ${seen.get(tag)}.`);
		else seen.set(tag, row);
		const site = siteByCode.get(c.get('site_code').toUpperCase());
		if (!site) c.fail('site_code', `No site with code “${c.get('site_code')}”.`);
		const ruleName = c.get('rule_set');
		const ruleSetId = ruleName ? (ruleByName.get(ruleName.toLowerCase()) ?? null) : null;
		if (ruleName && !ruleSetId) c.fail('rule_set', `No rule set named “${ruleName}”.`);
		const asset = rowAsset(c, ruleSetId);
		const sources = rowSources(c, asset);
		if (!c.ok || !site || !asset.success) return;
		rows.push({
			row,
			tag,
			siteId: site.id,
			areaName: c.get('area') || null,
			asset: asset.data,
			sources
		});
	});
	return { rows: errors.length ? [] : rows, errors, total: parsed.data.length };
}

/** Imports all rows or none; returns how many were added and updated. */
export function run(
	text: string,
	actorId: string,
	now = Date.now()
): { errors: RowError[]; added: number; updated: number } {
	const { rows, errors } = validate(text);
	if (errors.length) return { errors, added: 0, updated: 0 };
	let added = 0;
	let updated = 0;
	db.transaction((tx) => {
		const version = nextVersion(tx);
		for (const r of rows) {
			let areaId: string | null = null;
			if (r.areaName) {
				const area = tx
					.select()
					.from(areas)
					.all()
					.find((a) => a.siteId === r.siteId && a.name.toLowerCase() === r.areaName!.toLowerCase());
				areaId = area?.id ?? crypto.randomUUID();
				if (!area)
					tx.insert(areas)
						.values({
							id: areaId,
							siteId: r.siteId,
							name: r.areaName,
							version,
							createdAt: now,
							updatedAt: now
						})
						.run();
			}
			const existing = tx.select().from(assets).where(eq(assets.tag, r.tag)).get();
			const id = existing?.id ?? crypto.randomUUID();
			if (existing) {
				tx.update(assets)
					.set({ ...r.asset, siteId: r.siteId, areaId, version, updatedAt: now })
					.where(eq(assets.id, id))
					.run();
				updated++;
			} else {
				tx.insert(assets)
					.values({
						id,
						tag: r.tag,
						...r.asset,
						siteId: r.siteId,
						areaId,
						version,
						createdAt: now,
						updatedAt: now
					})
					.run();
				added++;
			}
			if (r.sources.length || !existing) {
				tx.delete(excitationSources).where(eq(excitationSources.assetId, id)).run();
				r.sources.forEach((s, i) =>
					tx
						.insert(excitationSources)
						.values({
							id: crypto.randomUUID(),
							assetId: id,
							kind: s.kind,
							label: s.label,
							params: s.params,
							sortOrder: i,
							version,
							createdAt: now,
							updatedAt: now
						})
						.run()
				);
			}
			audit.by(tx, actorId, now)('asset', id, existing ? 'import (update)' : 'import (new)', {
				before: existing
					? { name: existing.name, minRpm: existing.minRpm, maxRpm: existing.maxRpm }
					: null,
				after: { ...r.asset, sources: r.sources.length }
			});
			refreshAsset(tx, id, now);
		}
	});
	return { errors: [], added, updated };
}
