/**
 * Opens the SQLite database with the settings Detune relies on, and applies the committed
 * migrations. Free of SvelteKit imports so the command-line tools (seed, backup, bench) use it too.
 */
import { chmodSync, existsSync, mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import * as schema from './schema.ts';

export type Db = BetterSQLite3Database<typeof schema>;
/** What a query module needs of a transaction (or of the database itself, outside one). */
export type Tx = Pick<Db, 'select' | 'insert' | 'update' | 'delete'>;

/** The embedded default: a file under data/ (git-ignored) beside the project. */
export const DEFAULT_DATABASE_URL = 'data/detune.db';

export interface Opened {
	sqlite: Database.Database;
	db: Db;
	file: string;
}

export function openDatabase(url: string = DEFAULT_DATABASE_URL): Opened {
	const file = url.startsWith('file:') ? url.slice(5) : url;
	if (file !== ':memory:') mkdirSync(dirname(resolve(file)), { recursive: true });
	const sqlite = new Database(file);
	sqlite.pragma('journal_mode = WAL');
	// the database holds the plant's records and the session hashes: owner only (SQLite gives the
	// -wal and -shm files the same mode)
	if (file !== ':memory:')
		for (const f of [file, `${file}-wal`, `${file}-shm`]) if (existsSync(f)) chmodSync(f, 0o600);
	sqlite.pragma('foreign_keys = ON');
	sqlite.pragma('busy_timeout = 5000');
	sqlite.pragma('synchronous = NORMAL');
	return { sqlite, db: drizzle(sqlite, { schema }), file };
}

/** Applies every migration in drizzle/ that this database has not seen, in one go. */
export function runMigrations(db: Db, folder = process.env.MIGRATIONS_DIR ?? 'drizzle'): void {
	migrate(db, { migrationsFolder: resolve(folder) });
}
