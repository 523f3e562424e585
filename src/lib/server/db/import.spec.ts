import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { freshDatabase } from '../test-db.ts';
import { db } from './index.ts';
import { assets, excitationSources } from './schema.ts';
import { TEMPLATE, run, validate } from './import.ts';

beforeAll(async () => {
	await freshDatabase({ demo: true });
});

describe('asset import', () => {
	it('accepts its own template', () => {
		const v = validate(TEMPLATE);
		expect(v.errors).toEqual([]);
		expect(v.rows.map((r) => r.tag)).toEqual(['KRW-RWP-105', 'LBM-EXF-130']);
	});

	it('takes a fixed forcing frequency in CPM, and refuses it given twice', () => {
		const [head, first] = TEMPLATE.split('\r\n');
		const cols = head.split(',');
		const at = (name: string) => cols.indexOf(name);
		const cells = first.replace('"Pump structures 15 %, vane pass 20 %"', '').split(',');
		const row = (hz: string, cpm: string) => {
			const c = [...cells];
			c[at('fixed_hz')] = hz;
			c[at('fixed_cpm')] = cpm;
			return [head, c.join(',')].join('\r\n');
		};
		// 7,200 CPM is 120 Hz (1 Hz = 60 CPM)
		const v = validate(row('', '7200'));
		expect(v.errors).toEqual([]);
		expect(v.rows[0].sources.find((s) => s.kind === 'fixed')?.params).toEqual({ frequencyHz: 120 });
		expect(validate(row('120', '7200')).errors).toEqual([
			expect.objectContaining({
				row: 2,
				column: 'fixed_cpm',
				message: 'Give the fixed frequency once: in fixed_hz or in fixed_cpm, not both.'
			})
		]);
	});

	it('names the row and column of a bad value and imports nothing', () => {
		const bad = TEMPLATE.replace(
			'LBM-EXF-130,Dryer exhaust fan,LBM,Dryer Section,fan,fixed,1180,1180',
			'LBM-EXF-130,Dryer exhaust fan,LBM,Dryer Section,fan,fixed,1180,900'
		);
		const r = run(bad, null as unknown as string);
		expect(r.errors).toEqual([
			{
				row: 3,
				column: 'max_rpm',
				value: '900',
				message: 'Maximum speed must be at least the minimum speed.'
			},
			{
				row: 3,
				column: 'max_rpm',
				value: '900',
				message:
					'A fixed-speed machine has one speed: make minimum and maximum equal, or choose vfd.'
			}
		]);
		expect(db.select().from(assets).where(eq(assets.tag, 'KRW-RWP-105')).get()).toBeUndefined();
	});

	it('names a row’s speed problem even when another of its fields is wrong too, in one pass', () => {
		// before: a wrong machine group hid the reversed speed range until the next round
		const bad = TEMPLATE.replace(
			'LBM-EXF-130,Dryer exhaust fan,LBM,Dryer Section,fan,fixed,1180,1180',
			'LBM-EXF-130,Dryer exhaust fan,LBM,Dryer Section,fan,vfd,1180,900'
		).replace(/,group2$/, ',group9');
		const r = validate(bad);
		expect(r.errors.filter((e) => e.row === 3).map((e) => e.column)).toEqual(
			expect.arrayContaining(['machine_group', 'max_rpm'])
		);
	});

	it('imports all rows, and a second import updates by tag', () => {
		const first = run(TEMPLATE, null as unknown as string);
		expect(first).toEqual({ errors: [], added: 2, updated: 0 });
		const again = run(
			TEMPLATE.replace('Raw water pump 5', 'Raw water pump 5 (new motor)'),
			null as unknown as string
		);
		expect(again).toEqual({ errors: [], added: 0, updated: 2 });
		const a = db.select().from(assets).where(eq(assets.tag, 'KRW-RWP-105')).get()!;
		expect(a.name).toBe('Raw water pump 5 (new motor)');
		expect(
			db
				.select()
				.from(excitationSources)
				.where(eq(excitationSources.assetId, a.id))
				.all()
				.map((s) => s.kind)
		).toEqual(['shaft', 'vane', 'bearing', 'line']);
	});

	it('refuses unknown columns, unknown sites and duplicate tags', () => {
		expect(
			validate('tag,name,site_code,min_rpm,max_rpm,colour\nA-1,x,KRW,1,1,red').errors[0].message
		).toMatch(/Unknown column “colour”/);
		expect(
			validate('tag,name,site_code,min_rpm,max_rpm\nA-1,Pump,XYZ,100,100').errors[0]
		).toMatchObject({ row: 2, column: 'site_code' });
		expect(
			validate('tag,name,site_code,min_rpm,max_rpm\nA-1,Pump,KRW,100,100\nA-1,Pump,KRW,100,100')
				.errors[0]
		).toMatchObject({ row: 3, column: 'tag', message: 'Tag A-1 is also on row 2.' });
	});

	it('answers a header of a million columns with one short message', () => {
		// on the first version each unknown column was its own message: a 129 MB answer
		const header = Array.from({ length: 1_000_000 }, (_, i) => `c${i}`).join(',');
		const v = validate(`${header}\nA-1`);
		expect(v.errors).toHaveLength(1);
		expect(v.errors[0].message).toMatch(/^The header row is 7,888,889 characters long/);
		expect(JSON.stringify(v).length).toBeLessThan(500);
	});

	it('names several unknown columns in one message', () => {
		const extra = Array.from({ length: 40 }, (_, i) => `x${i}`).join(',');
		const v = validate(
			`tag,name,site_code,min_rpm,max_rpm,${extra}\nA-1,x,KRW,1,1${','.repeat(40)}`
		);
		expect(v.errors).toEqual([
			{
				row: 1,
				column: '',
				message:
					'Unknown columns “x0”, “x1”, “x2”, “x3”, “x4” and 35 more; the template lists the columns.'
			}
		]);
	});

	it('says a picture or a workbook is not CSV text instead of naming its bytes as columns', () => {
		// a PNG's signature and IHDR chunk, read as UTF-8 the way File.text() reads it
		const png = new TextDecoder().decode(
			new Uint8Array([
				0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d, 0x49, 0x48, 0x44, 0x52, 0, 0,
				1, 0, 0, 0, 1, 0, 8, 6, 0, 0, 0
			])
		);
		expect(validate(png).errors).toEqual([
			expect.objectContaining({
				row: 1,
				message: expect.stringMatching(/^This file is not CSV text/)
			})
		]);
		const xlsx = new TextDecoder().decode(new Uint8Array([0x50, 0x4b, 3, 4, 20, 0, 6, 0]));
		expect(validate(xlsx).errors[0].message).toMatch(/zipped file \(an \.xlsx workbook/);
	});

	it('lists every problem of every row in one pass, each with its row, column and value', () => {
		// before, each row stopped at its first problem, so a file took a round per problem
		const lines = TEMPLATE.split('\r\n');
		const header = lines[0].split(',');
		const row = (values: Record<string, string>) => header.map((h) => values[h] ?? '').join(',');
		const text = [
			lines[0],
			row({ tag: 'x', name: 'Pump A', site_code: 'NOPE', min_rpm: '100', max_rpm: '200' }),
			row({
				tag: 'KRW-T-1',
				name: 'Pump B',
				site_code: 'KRW',
				min_rpm: 'fast',
				max_rpm: '200',
				vane_count: '-3'
			}),
			row({ tag: 'KRW-T-2', name: 'Pump C', site_code: 'KRW', min_rpm: '100', max_rpm: '200' })
		].join('\n');
		const r = validate(text);
		const at = (n: number) => r.errors.filter((e) => e.row === n).map((e) => e.column);
		expect(at(2)).toEqual(expect.arrayContaining(['tag', 'site_code']));
		expect(at(3)).toEqual(expect.arrayContaining(['min_rpm', 'vane_count']));
		expect(at(4)).toEqual([]);
		expect(r.errors.find((e) => e.column === 'min_rpm')?.value).toBe('fast');
		expect(r.rows).toEqual([]);
	});
});
