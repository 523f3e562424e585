/**
 * Online backup of the SQLite database (better-sqlite3's backup API: consistent while the server
 * runs) together with the uploaded files, and the restore of one. Restore only with the server
 * stopped: it replaces the database file.
 */
import {
	chmodSync,
	cpSync,
	existsSync,
	mkdirSync,
	readdirSync,
	rmSync,
	writeFileSync,
	readFileSync
} from 'node:fs';
import { join, resolve } from 'node:path';
import Database from 'better-sqlite3';
import { serverHolding } from './db/server-lock.ts';

export interface BackupManifest {
	createdAt: string;
	database: string;
	files: number;
	integrity: string;
}

function countFiles(dir: string): number {
	if (!existsSync(dir)) return 0;
	let n = 0;
	for (const e of readdirSync(dir, { withFileTypes: true }))
		n += e.isDirectory() ? countFiles(join(dir, e.name)) : 1;
	return n;
}

export async function backup(
	databaseFile: string,
	dataDir: string,
	into: string
): Promise<BackupManifest> {
	const dest = resolve(into);
	mkdirSync(dest, { recursive: true, mode: 0o700 });
	chmodSync(dest, 0o700);
	const source = new Database(databaseFile, { readonly: true, fileMustExist: true });
	try {
		await source.backup(join(dest, 'detune.db'));
	} finally {
		source.close();
	}
	const copy = new Database(join(dest, 'detune.db'), { readonly: true });
	const integrity = (copy.pragma('integrity_check', { simple: true }) as string) ?? 'unknown';
	copy.close();
	if (integrity !== 'ok')
		throw new Error(`The backup copy failed its integrity check: ${integrity}`);
	if (existsSync(dataDir)) cpSync(dataDir, join(dest, 'files'), { recursive: true });
	const manifest = {
		createdAt: new Date().toISOString(),
		database: 'detune.db',
		files: countFiles(join(dest, 'files')),
		integrity
	};
	writeFileSync(join(dest, 'manifest.json'), JSON.stringify(manifest, null, 2), { mode: 0o600 });
	chmodSync(join(dest, 'detune.db'), 0o600);
	return manifest;
}

/** A restore refused: the server is running on the database, or the backup is not sound. */
export class RestoreRefused extends Error {}

export function restore(from: string, databaseFile: string, dataDir: string): BackupManifest {
	const holder = serverHolding(databaseFile);
	if (holder)
		throw new RestoreRefused(
			`A Detune server (process ${holder.pid}) is running on ${databaseFile}. Stop it first: a restore under a running server loses what it writes afterwards.`
		);
	const src = resolve(from);
	const manifest = JSON.parse(readFileSync(join(src, 'manifest.json'), 'utf8')) as BackupManifest;
	const check = new Database(join(src, manifest.database), { readonly: true, fileMustExist: true });
	const integrity = check.pragma('integrity_check', { simple: true });
	check.close();
	if (integrity !== 'ok')
		throw new Error(`The backup's database failed its integrity check: ${integrity}`);
	for (const suffix of ['', '-wal', '-shm']) rmSync(databaseFile + suffix, { force: true });
	cpSync(join(src, manifest.database), databaseFile);
	chmodSync(databaseFile, 0o600);
	// sessions do not come back from a backup: everyone signs in again
	const restored = new Database(databaseFile);
	restored.prepare('delete from sessions').run();
	restored.close();
	rmSync(dataDir, { recursive: true, force: true });
	if (existsSync(join(src, 'files'))) cpSync(join(src, 'files'), dataDir, { recursive: true });
	return manifest;
}
