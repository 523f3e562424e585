import { afterAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { openDatabase, runMigrations } from './db/client.ts';
import { health } from './health.ts';

const dir = mkdtempSync(join(tmpdir(), 'detune-health-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('health', () => {
	it('is ok when the database can be written and the data folder exists', () => {
		const { sqlite, db } = openDatabase(join(dir, 'ok.db'));
		runMigrations(db);
		mkdirSync(join(dir, 'files'));
		expect(health(sqlite, join(dir, 'files'))).toEqual({ ok: true, problems: [] });
		// and the check leaves nothing behind
		expect(sqlite.prepare('select count(*) as n from sync_state where id = -1').get()).toEqual({
			n: 0
		});
		sqlite.close();
	});

	it('says so on a read-only database and a missing data folder', () => {
		const ro = new Database(join(dir, 'ok.db'), { readonly: true });
		const h = health(ro, join(dir, 'nowhere'));
		expect(h.ok).toBe(false);
		expect(h.problems.join(' ')).toMatch(/cannot be written: attempt to write a readonly database/);
		expect(h.problems.join(' ')).toMatch(/data folder .*nowhere does not exist/);
		ro.close();
	});
});
