/**
 * A running server marks the database it holds (`<database>.server`, its process id), so that a
 * restore, which replaces the file, can refuse while it runs: writes acknowledged after a restore
 * under a live server would be lost at its restart. A mark left by a killed server is stale (its
 * process is gone) and ignored.
 */
import { existsSync, readFileSync, rmSync, writeFileSync } from 'node:fs';

const markOf = (databaseFile: string) => `${databaseFile}.server`;

function alive(pid: number): boolean {
	try {
		process.kill(pid, 0);
		return true;
	} catch (e) {
		return (e as NodeJS.ErrnoException).code === 'EPERM';
	}
}

/** The running server that holds this database, if any. */
export function serverHolding(databaseFile: string): { pid: number } | null {
	const mark = markOf(databaseFile);
	if (!existsSync(mark)) return null;
	const pid = Number(readFileSync(mark, 'utf8').trim());
	return Number.isInteger(pid) && pid > 0 && pid !== process.pid && alive(pid) ? { pid } : null;
}

/** Marks the database as held by this process until it exits. */
export function holdDatabase(databaseFile: string): void {
	if (databaseFile === ':memory:') return;
	const mark = markOf(databaseFile);
	writeFileSync(mark, String(process.pid), { mode: 0o600 });
	process.once('exit', () => {
		try {
			if (readFileSync(mark, 'utf8').trim() === String(process.pid)) rmSync(mark);
		} catch {
			/* already gone */
		}
	});
}
