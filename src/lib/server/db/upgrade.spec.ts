import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openDatabase, runMigrations } from './client.ts';
import { seed } from './seed.ts';

const dir = mkdtempSync(join(tmpdir(), 'detune-upgrade-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const journal = JSON.parse(readFileSync('drizzle/meta/_journal.json', 'utf8')) as {
	entries: { tag: string; when: number }[];
};

describe('upgrading a database in use', () => {
	it('0010 fills the worst pair’s frequency and label from the text a plant’s board already holds', async () => {
		// a plant's database as 0009 left it: seeded, then the columns 0010 adds taken away again
		const { db, sqlite } = openDatabase(join(dir, 'plant.db'));
		runMigrations(db);
		await seed(db);
		const before = sqlite
			.prepare('select asset_id, worst_natural_hz, worst_label from asset_status')
			.all() as { asset_id: string; worst_natural_hz: number | null; worst_label: string | null }[];
		expect(before.filter((r) => r.worst_natural_hz !== null).length).toBeGreaterThan(20);
		const m10 = journal.entries.find((e) => e.tag === '0010_frequency-unit')!;
		sqlite.exec(`
			alter table asset_status drop column worst_natural_hz;
			alter table asset_status drop column worst_label;
			alter table checks drop column worst_natural_hz;
			alter table checks drop column worst_label;
			alter table users drop column frequency_unit;
			delete from __drizzle_migrations where created_at = ${m10.when};
		`);
		runMigrations(db);
		const after = new Map(
			(
				sqlite
					.prepare('select asset_id, worst_natural_hz, worst_label from asset_status')
					.all() as typeof before
			).map((r) => [r.asset_id, r])
		);
		for (const b of before) {
			const a = after.get(b.asset_id)!;
			if (b.worst_natural_hz === null) expect(a.worst_natural_hz).toBeNull();
			else {
				// the stored text carries two decimals of Hz
				expect(a.worst_natural_hz).toBeCloseTo(b.worst_natural_hz, 2);
				expect(a.worst_label).toBe(b.worst_label);
			}
		}
		const users = sqlite.prepare('select distinct frequency_unit as u from users').all();
		expect(users).toEqual([{ u: 'Hz' }]);
		sqlite.close();
	});
});
