/**
 * What /api/health reports: not only that the database answers, but that the server can do its
 * job — write to the database (inside a savepoint that is rolled back) and keep files in the data
 * folder. Anything wrong is said in words, for the person who reads the monitor.
 */
import { accessSync, constants, existsSync } from 'node:fs';
import type Database from 'better-sqlite3';

export interface Health {
	ok: boolean;
	problems: string[];
}

export function health(sqlite: Database.Database, dataDir: string): Health {
	const problems: string[] = [];
	try {
		sqlite.exec('SAVEPOINT health');
		try {
			sqlite.prepare('insert into sync_state (id, version) values (-1, 0)').run();
		} finally {
			sqlite.exec('ROLLBACK TO health; RELEASE health');
		}
	} catch (e) {
		problems.push(`The database cannot be written: ${(e as Error).message}.`);
	}
	if (!existsSync(dataDir)) problems.push(`The data folder ${dataDir} does not exist.`);
	else
		try {
			accessSync(dataDir, constants.W_OK);
		} catch {
			problems.push(`The data folder ${dataDir} cannot be written.`);
		}
	return { ok: problems.length === 0, problems };
}
