/** For server specs: migrate the in-memory database of this test file, optionally with demo data. */
import { db } from './db/index.ts';
import { runMigrations } from './db/client.ts';
import { seed } from './db/seed.ts';

export async function freshDatabase(options: { demo?: boolean } = {}) {
	runMigrations(db);
	if (options.demo) await seed(db);
	return db;
}
