import { describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { openDatabase, runMigrations } from './db/client.ts';
import { seed } from './db/seed.ts';
import { backup, restore } from './backup.ts';

describe('backup and restore', () => {
	it('round-trips the database (taken while open) and the uploaded files', async () => {
		const dir = mkdtempSync(join(tmpdir(), 'detune-backup-'));
		const file = join(dir, 'live.db');
		const files = join(dir, 'files');
		const { db, sqlite } = openDatabase(file);
		runMigrations(db);
		await seed(db);
		mkdirSync(join(files, 'recordings', 'ab'), { recursive: true });
		writeFileSync(join(files, 'recordings', 'ab', 'abcdef'), 'time,accel\n0,1\n');
		const before = sqlite.prepare('select count(*) n from checks').get() as { n: number };
		// the backup runs while the database is open and in WAL mode
		const m = await backup(file, files, join(dir, 'b1'));
		expect(m).toMatchObject({ integrity: 'ok', files: 1 });
		sqlite.prepare('delete from asset_status').run();
		sqlite.prepare('delete from modes').run();
		sqlite.prepare('delete from checks').run();
		sqlite.close();
		writeFileSync(join(files, 'recordings', 'ab', 'abcdef'), 'overwritten');
		restore(join(dir, 'b1'), file, files);
		const back = new Database(file, { readonly: true });
		expect(back.prepare('select count(*) n from checks').get()).toEqual(before);
		expect(back.pragma('integrity_check', { simple: true })).toBe('ok');
		back.close();
		expect(readFileSync(join(files, 'recordings', 'ab', 'abcdef'), 'utf8')).toBe(
			'time,accel\n0,1\n'
		);
		expect(existsSync(join(dir, 'b1', 'manifest.json'))).toBe(true);
	});
});
