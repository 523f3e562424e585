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

	it('names the row and column of a bad value and imports nothing', () => {
		const bad = TEMPLATE.replace(
			'LBM-EXF-130,Dryer exhaust fan,LBM,Dryer Section,fan,fixed,1180,1180',
			'LBM-EXF-130,Dryer exhaust fan,LBM,Dryer Section,fan,fixed,1180,900'
		);
		const r = run(bad, null as unknown as string);
		expect(r.errors).toEqual([
			{ row: 3, column: 'max_rpm', message: 'Maximum speed must be at least the minimum speed.' }
		]);
		expect(db.select().from(assets).where(eq(assets.tag, 'KRW-RWP-105')).get()).toBeUndefined();
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
});
